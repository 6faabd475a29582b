import type { Knex } from 'knex';

/**
 * Counters of the rate limits (sign-in, password reset), kept in the database so that every server
 * on it counts the same tries: one row per limit and client key, with the end of its window.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rate_limit_hits', (t) => {
    // The limit's name and a SHA-256 of the client key: fixed length whatever a client sends.
    t.string('key', 100).primary();
    t.integer('hits').notNullable();
    /** ISO-8601 UTC: when this window ends and the count starts again. */
    t.string('reset_at', 32).notNullable();
    t.index(['reset_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rate_limit_hits');
}
