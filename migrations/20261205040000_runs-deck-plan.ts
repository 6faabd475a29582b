import type { Knex } from 'knex';

/**
 * Runs and their deck plan: the lorry's deck size and each product's pallet footprint (mm), the drop
 * order the yard sets on each booking (null = after the ordered ones, in booking order), the pallets
 * ticked as loaded (by order and pallet number, so they stay ticked when the drop order changes), and
 * when the run was sent out, by whom and with what override reason.
 *
 * Plain ADD COLUMN, not knex's alterTable: on SQLite that rebuilds a table for some column changes,
 * which would drop the triggers of tables that have them.
 */
export async function up(knex: Knex): Promise<void> {
  // A rigid's deck: 7300 × 2450 mm (common practice for an 18 t builders'-merchant rigid).
  await knex.raw('ALTER TABLE lorries ADD COLUMN deck_length_mm INTEGER NOT NULL DEFAULT 7300');
  await knex.raw('ALTER TABLE lorries ADD COLUMN deck_width_mm INTEGER NOT NULL DEFAULT 2450');
  // 1200 × 1000 mm, among the ISO 6780 pallet sizes.
  await knex.raw('ALTER TABLE products ADD COLUMN pallet_length_mm INTEGER NOT NULL DEFAULT 1200');
  await knex.raw('ALTER TABLE products ADD COLUMN pallet_width_mm INTEGER NOT NULL DEFAULT 1000');
  await knex.raw('ALTER TABLE slot_bookings ADD COLUMN drop_position INTEGER NULL');
  await knex.raw('ALTER TABLE delivery_slots ADD COLUMN sent_out_at TEXT NULL');
  await knex.raw('ALTER TABLE delivery_slots ADD COLUMN sent_out_by INTEGER NULL REFERENCES users(id) ON DELETE SET NULL');
  await knex.raw('ALTER TABLE delivery_slots ADD COLUMN send_out_override TEXT NULL');

  await knex.schema.createTable('run_loaded_pallets', (t) => {
    t.integer('slot_id').notNullable().references('id').inTable('delivery_slots').onDelete('CASCADE');
    t.integer('order_id').notNullable().references('id').inTable('orders').onDelete('CASCADE');
    t.integer('pallet').notNullable();
    t.integer('loaded_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('loaded_at', 30).notNullable();
    t.primary(['slot_id', 'order_id', 'pallet']);
    t.index(['order_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('run_loaded_pallets');
  await knex.raw('ALTER TABLE delivery_slots DROP COLUMN send_out_override');
  await knex.raw('ALTER TABLE delivery_slots DROP COLUMN sent_out_by');
  await knex.raw('ALTER TABLE delivery_slots DROP COLUMN sent_out_at');
  await knex.raw('ALTER TABLE slot_bookings DROP COLUMN drop_position');
  await knex.raw('ALTER TABLE products DROP COLUMN pallet_width_mm');
  await knex.raw('ALTER TABLE products DROP COLUMN pallet_length_mm');
  await knex.raw('ALTER TABLE lorries DROP COLUMN deck_width_mm');
  await knex.raw('ALTER TABLE lorries DROP COLUMN deck_length_mm');
}
