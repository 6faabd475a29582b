import type { Knex } from 'knex';

/**
 * A substitute tile is offered with the engine's figures for the order's own roof (the bill before and
 * after, the faces it does not suit, the price difference), kept as JSON text on the proposal line so
 * the contractor reads exactly what the desk was shown.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE order_proposal_lines ADD COLUMN substitute_figures TEXT NULL');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE order_proposal_lines DROP COLUMN substitute_figures');
}
