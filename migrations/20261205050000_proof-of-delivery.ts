import type { Knex } from 'knex';

/**
 * Proof of delivery and retried writes.
 * - delivery_proofs: one per delivered order — who took it, when, where the phone was, the note.
 * - delivery_proof_lines: per order line the packs sent, handed over, short and damaged.
 * - delivery_files: the signature and photos as blobs with a thumbnail; served only through
 *   access-checked routes, never from a public folder.
 * - credit_note_drafts: shortages and damages priced at the order's prices, for the desk to issue as a
 *   credit note against the invoice (a credit note needs an invoice and a number; a draft has neither).
 * - run_caution_reads: a driver's acknowledgement of a run's cautions.
 * - idempotency_keys: the first answer to a write sent with an Idempotency-Key, kept 24 h, so a retry
 *   gets the same answer and changes nothing.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('delivery_proofs', (t) => {
    t.increments('id').primary();
    t.integer('order_id').notNullable().unique().references('id').inTable('orders').onDelete('CASCADE');
    t.integer('merchant_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.string('receiver_name', 120).notNullable();
    t.string('delivered_at', 30).notNullable();
    t.integer('recorded_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('recorded_by_name', 120).notNullable();
    t.double('lat').nullable();
    t.double('lng').nullable();
    t.double('accuracy_m').nullable();
    t.string('note', 2000).notNullable().defaultTo('');
    t.string('created_at', 30).notNullable();
  });

  await knex.schema.createTable('delivery_proof_lines', (t) => {
    t.increments('id').primary();
    t.integer('proof_id').notNullable().references('id').inTable('delivery_proofs').onDelete('CASCADE');
    t.integer('order_line_id').notNullable().references('id').inTable('order_lines').onDelete('CASCADE');
    t.integer('sent').notNullable();
    t.integer('handed_over').notNullable();
    t.integer('short').notNullable();
    t.integer('damaged').notNullable();
    t.unique(['proof_id', 'order_line_id']);
    t.check('?? >= 0 and ?? >= 0 and ?? >= 0 and ?? + ?? + ?? = ??', ['handed_over', 'short', 'damaged', 'handed_over', 'short', 'damaged', 'sent'], 'delivery_proof_lines_add_up');
  });

  await knex.schema.createTable('delivery_files', (t) => {
    t.increments('id').primary();
    t.integer('proof_id').notNullable().references('id').inTable('delivery_proofs').onDelete('CASCADE');
    t.string('kind', 20).notNullable();
    t.integer('position').notNullable();
    t.string('content_type', 40).notNullable();
    t.integer('size').notNullable();
    t.binary('data').notNullable();
    t.binary('thumbnail').nullable();
    t.string('created_at', 30).notNullable();
    t.index(['proof_id', 'kind', 'position']);
  });

  await knex.schema.createTable('credit_note_drafts', (t) => {
    t.increments('id').primary();
    t.integer('merchant_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('contractor_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('order_id').notNullable().references('id').inTable('orders').onDelete('CASCADE');
    t.integer('proof_id').notNullable().unique().references('id').inTable('delivery_proofs').onDelete('CASCADE');
    t.string('status', 20).notNullable().defaultTo('draft');
    t.string('currency', 3).notNullable();
    t.integer('subtotal').notNullable();
    t.integer('tax_total').notNullable();
    t.integer('total').notNullable();
    // Per line: order_line_id, sku, description, unit, short, damaged, quantity, unit_price, tax_rate_bp, net, tax, total.
    t.text('lines').notNullable();
    t.string('notes', 2000).notNullable().defaultTo('');
    t.string('created_at', 30).notNullable();
    t.index(['merchant_organisation_id', 'status']);
    t.index(['order_id']);
  });

  await knex.schema.createTable('run_caution_reads', (t) => {
    t.increments('id').primary();
    t.integer('slot_id').notNullable().references('id').inTable('delivery_slots').onDelete('CASCADE');
    t.integer('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.string('user_name', 120).notNullable();
    t.string('read_at', 30).notNullable();
    t.unique(['slot_id', 'user_id']);
  });

  await knex.schema.createTable('idempotency_keys', (t) => {
    t.integer('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.string('key', 200).notNullable();
    // Method and path of the request, e.g. "POST /api/orders/12/delivery".
    t.string('route', 300).notNullable();
    // SHA-256 of the request's body (and files), so the same key with another body is refused.
    t.string('request_hash', 64).notNullable();
    // Null while the first request is still being answered.
    t.integer('status').nullable();
    t.string('content_type', 100).nullable();
    t.text('body').nullable();
    t.string('created_at', 30).notNullable();
    t.string('expires_at', 30).notNullable();
    t.primary(['user_id', 'key', 'route']);
    t.index(['expires_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['idempotency_keys', 'run_caution_reads', 'credit_note_drafts', 'delivery_files', 'delivery_proof_lines', 'delivery_proofs']) {
    await knex.schema.dropTableIfExists(table);
  }
}
