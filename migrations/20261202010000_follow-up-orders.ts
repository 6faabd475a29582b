import type { Knex } from 'knex';

/**
 * Back-ordered packs travel later as an order of their own that names the order it follows. One
 * live follow-up per order at most: the unique index makes a second one impossible even if two people
 * start it at once; a follow-up cancelled or turned down leaves the index, so the packs can be sent
 * on again.
 *
 * Plain ADD COLUMN, not knex's alterTable: on SQLite that rebuilds the table for a foreign key,
 * which drops the order-book triggers on it.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE orders ADD COLUMN follows_order_id INTEGER NULL REFERENCES orders(id) ON DELETE SET NULL');
  await knex.raw("CREATE UNIQUE INDEX orders_one_follow_up ON orders(follows_order_id) WHERE status NOT IN ('cancelled', 'turned_down')");
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX IF EXISTS orders_one_follow_up');
  await knex.raw('ALTER TABLE orders DROP COLUMN follows_order_id');
}
