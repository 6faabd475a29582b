import type { Knex } from 'knex';

/**
 * The mail outbox: every e-mail is written here in the same transaction as the change it reports,
 * and a worker sends it. `message_id` is made at insert and sent as the Message-ID header, so a
 * message sent again after a crash (between the mail server's accept and the row being marked sent)
 * is the same message to the receiving side. Attachments are kept as JSON: small ones inline, large
 * ones (a delivery note with its photos) as a reference the worker renders when it sends.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_outbox', (t) => {
    t.increments('id').primary();
    t.string('message_id', 200).notNullable().unique();
    t.string('recipient', 320).notNullable();
    t.string('subject', 500).notNullable();
    t.text('text').notNullable();
    t.text('html').nullable();
    t.text('attachments').nullable();
    t.string('status', 10).notNullable().defaultTo('queued');
    t.integer('attempts').notNullable().defaultTo(0);
    t.string('next_attempt_at', 30).notNullable();
    t.string('claimed_by', 120).nullable();
    t.string('claimed_at', 30).nullable();
    t.text('last_error').nullable();
    t.string('created_at', 30).notNullable();
    t.string('sent_at', 30).nullable();
    t.check("?? in ('queued', 'sending', 'sent', 'failed')", ['status'], 'mail_outbox_status');
    // The worker's claim reads due rows in order of their next attempt; health reads the oldest queued.
    t.index(['status', 'next_attempt_at'], 'mail_outbox_due');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('mail_outbox');
}
