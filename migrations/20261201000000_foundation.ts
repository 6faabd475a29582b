import type { Knex } from 'knex';

/** Organisations, branches, users, invitations, password resets and the development outbox. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('organisations', (t) => {
    t.increments('id').primary();
    t.string('name', 120).notNullable();
    t.string('kind', 20).notNullable();
    t.string('created_at', 30).notNullable();
  });

  await knex.schema.createTable('branches', (t) => {
    t.increments('id').primary();
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.string('name', 120).notNullable();
    t.string('address', 300).notNullable();
    t.string('town', 120).notNullable();
    t.string('phone', 40).nullable();
    t.string('created_at', 30).notNullable();
    t.index(['organisation_id']);
  });

  await knex.schema.createTable('users', (t) => {
    t.increments('id').primary();
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.string('email', 254).notNullable().unique();
    t.string('name', 120).notNullable();
    t.string('role', 40).notNullable();
    t.string('password_hash', 200).notNullable();
    t.string('created_at', 30).notNullable();
    t.index(['organisation_id']);
  });

  await knex.schema.createTable('invitations', (t) => {
    t.increments('id').primary();
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.string('email', 254).notNullable();
    t.string('role', 40).notNullable();
    t.string('token_hash', 64).notNullable().unique();
    t.integer('invited_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('expires_at', 30).notNullable();
    t.string('accepted_at', 30).nullable();
    t.string('revoked_at', 30).nullable();
    t.string('created_at', 30).notNullable();
    t.index(['organisation_id']);
  });

  await knex.schema.createTable('password_resets', (t) => {
    t.increments('id').primary();
    t.integer('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.string('token_hash', 64).notNullable().unique();
    t.string('expires_at', 30).notNullable();
    t.string('used_at', 30).nullable();
    t.string('created_at', 30).notNullable();
  });

  await knex.schema.createTable('dev_outbox', (t) => {
    t.increments('id').primary();
    t.string('from', 300).notNullable();
    t.text('to').notNullable();
    t.string('subject', 500).notNullable();
    t.text('text').notNullable();
    t.text('html').nullable();
    t.string('created_at', 30).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('dev_outbox');
  await knex.schema.dropTableIfExists('password_resets');
  await knex.schema.dropTableIfExists('invitations');
  await knex.schema.dropTableIfExists('users');
  await knex.schema.dropTableIfExists('branches');
  await knex.schema.dropTableIfExists('organisations');
}
