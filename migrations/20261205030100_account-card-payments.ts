import type { Knex } from 'knex';

/**
 * An account customer may pay an open invoice by card unless the merchant turns card payment off for
 * that account (1 = allowed, the default for every account).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE contractor_accounts ADD COLUMN card_payments INTEGER NOT NULL DEFAULT 1');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE contractor_accounts DROP COLUMN card_payments');
}
