import type { Knex } from 'knex';

/**
 * The merchant's desk and yard: tax rates on products, delivered quantities on order lines, comments
 * between the two sides, lorries and their calendar of delivery slots with the orders booked into
 * them, account terms per contractor, invoices and credit notes numbered per merchant without gaps,
 * and card payments with the provider's events and refunds. Weights in kg, money in integer minor
 * units, tax rates in basis points (2000 = 20 %), dates YYYY-MM-DD, times ISO text.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('products', (t) => {
    // The standard rate of VAT in the UK is 20 % (HMRC, "VAT rates"); a merchant changes it per product.
    t.integer('tax_rate_bp').notNullable().defaultTo(2000);
  });

  await knex.schema.alterTable('order_lines', (t) => {
    // Packs the driver handed over; null until the delivery is recorded.
    t.integer('delivered_quantity').nullable();
  });

  // The merchant's order book: each index leads with the merchant, then the sort column, and carries
  // the stage and branch so the desk's usual filters are checked inside the index, without the row.
  await knex.schema.alterTable('orders', (t) => {
    t.index(['merchant_organisation_id', 'placed_at', 'status', 'branch_id'], 'orders_merchant_placed');
    t.index(['merchant_organisation_id', 'requested_date', 'status', 'branch_id'], 'orders_merchant_requested');
    t.index(['merchant_organisation_id', 'updated_at', 'status', 'branch_id'], 'orders_merchant_updated');
    t.index(['merchant_organisation_id', 'branch_id', 'status', 'requested_date'], 'orders_merchant_branch_status');
    t.index(['merchant_organisation_id', 'contractor_organisation_id', 'placed_at'], 'orders_merchant_contractor_placed');
  });

  await knex.schema.createTable('order_comments', (t) => {
    t.increments('id').primary();
    t.integer('order_id').notNullable().references('id').inTable('orders').onDelete('CASCADE');
    t.integer('author_user_id').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('author_name', 120).notNullable();
    t.integer('author_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.string('body', 2000).notNullable();
    t.string('created_at', 30).notNullable();
    t.index(['order_id', 'id']);
  });

  await knex.schema.createTable('lorries', (t) => {
    t.increments('id').primary();
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('branch_id').notNullable().references('id').inTable('branches').onDelete('CASCADE');
    t.string('registration', 20).notNullable();
    t.string('name', 120).notNullable().defaultTo('');
    t.integer('payload_kg').notNullable();
    t.integer('pallet_slots').notNullable();
    t.boolean('has_crane').notNullable().defaultTo(false);
    // The heaviest load the crane lifts at the reach a delivery needs; null without a crane.
    t.integer('crane_max_kg').nullable();
    t.string('archived_at', 30).nullable();
    t.string('created_at', 30).notNullable();
    t.string('updated_at', 30).notNullable();
    t.unique(['organisation_id', 'registration']);
    t.index(['branch_id']);
    t.check('?? > 0 and ?? > 0', ['payload_kg', 'pallet_slots'], 'lorries_capacity_positive');
  });

  await knex.schema.createTable('delivery_slots', (t) => {
    t.increments('id').primary();
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('branch_id').notNullable().references('id').inTable('branches').onDelete('CASCADE');
    t.integer('lorry_id').notNullable().references('id').inTable('lorries').onDelete('CASCADE');
    t.string('date', 10).notNullable();
    t.string('time_window', 11).notNullable();
    t.integer('driver_user_id').nullable().references('id').inTable('users').onDelete('SET NULL');
    // Running totals of the bookings, changed only by guarded updates that keep them within the lorry.
    t.double('booked_kg').notNullable().defaultTo(0);
    t.integer('booked_pallets').notNullable().defaultTo(0);
    t.string('created_at', 30).notNullable();
    t.string('updated_at', 30).notNullable();
    t.unique(['lorry_id', 'date', 'time_window']);
    t.index(['branch_id', 'date']);
    t.index(['driver_user_id', 'date']);
    t.check('?? >= 0 and ?? >= 0', ['booked_kg', 'booked_pallets'], 'delivery_slots_booked_not_negative');
  });

  await knex.schema.createTable('slot_bookings', (t) => {
    t.increments('id').primary();
    t.integer('order_id').notNullable().unique().references('id').inTable('orders').onDelete('CASCADE');
    t.integer('slot_id').notNullable().references('id').inTable('delivery_slots').onDelete('RESTRICT');
    // What this order puts on the lorry, from the engine's delivery plan of what it sends.
    t.double('weight_kg').notNullable();
    t.integer('pallets').notNullable();
    t.double('heaviest_pallet_kg').notNullable();
    t.text('plan').notNullable().defaultTo('{}');
    t.integer('booked_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('booked_at', 30).notNullable();
    t.string('delivered_at', 30).nullable();
    t.string('received_by', 120).nullable();
    t.string('delivery_notes', 2000).nullable();
    t.integer('recorded_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.index(['slot_id']);
  });

  await knex.schema.createTable('contractor_accounts', (t) => {
    t.increments('id').primary();
    t.integer('merchant_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('contractor_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('terms_days').notNullable();
    t.string('created_at', 30).notNullable();
    t.string('updated_at', 30).notNullable();
    t.unique(['merchant_organisation_id', 'contractor_organisation_id']);
    t.check('?? >= 0 and ?? <= 120', ['terms_days', 'terms_days'], 'contractor_accounts_terms_range');
  });

  await knex.schema.createTable('document_sequences', (t) => {
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.string('series', 20).notNullable();
    t.integer('last_number').notNullable().defaultTo(0);
    t.primary(['organisation_id', 'series']);
  });

  await knex.schema.createTable('invoices', (t) => {
    t.increments('id').primary();
    t.integer('merchant_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('contractor_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('branch_id').notNullable().references('id').inTable('branches').onDelete('RESTRICT');
    t.integer('order_id').notNullable().unique().references('id').inTable('orders').onDelete('RESTRICT');
    t.integer('number').notNullable();
    t.string('currency', 3).notNullable();
    // What the quantities were taken from: the delivery as recorded, or the confirmation before it.
    t.string('basis', 20).notNullable();
    t.string('pay_by', 20).notNullable();
    t.string('issue_date', 10).notNullable();
    t.string('due_date', 10).nullable();
    t.integer('subtotal').notNullable();
    t.integer('tax_total').notNullable();
    t.integer('total').notNullable();
    t.integer('credited').notNullable().defaultTo(0);
    t.integer('paid').notNullable().defaultTo(0);
    t.integer('issued_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('created_at', 30).notNullable();
    t.string('updated_at', 30).notNullable();
    t.unique(['merchant_organisation_id', 'number']);
    t.index(['contractor_organisation_id', 'created_at']);
    t.check('?? >= 0 and ?? >= 0', ['paid', 'credited'], 'invoices_amounts_not_negative');
  });

  await knex.schema.createTable('invoice_lines', (t) => {
    t.increments('id').primary();
    t.integer('invoice_id').notNullable().references('id').inTable('invoices').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.integer('order_line_id').nullable().references('id').inTable('order_lines').onDelete('SET NULL');
    t.string('sku', 40).notNullable();
    t.string('description', 200).notNullable();
    t.string('unit', 20).notNullable();
    t.integer('pack_size').notNullable();
    t.integer('quantity').notNullable();
    t.integer('unit_price').notNullable();
    t.integer('tax_rate_bp').notNullable();
    t.integer('net').notNullable();
    t.integer('tax').notNullable();
    t.integer('total').notNullable();
    t.index(['invoice_id', 'position']);
  });

  await knex.schema.createTable('credit_notes', (t) => {
    t.increments('id').primary();
    t.integer('merchant_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('contractor_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('invoice_id').notNullable().references('id').inTable('invoices').onDelete('RESTRICT');
    t.integer('number').notNullable();
    t.string('reason', 20).notNullable();
    t.string('notes', 2000).notNullable().defaultTo('');
    t.integer('subtotal').notNullable();
    t.integer('tax_total').notNullable();
    t.integer('total').notNullable();
    t.integer('issued_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('created_at', 30).notNullable();
    t.unique(['merchant_organisation_id', 'number']);
    t.index(['invoice_id']);
  });

  await knex.schema.createTable('credit_note_lines', (t) => {
    t.increments('id').primary();
    t.integer('credit_note_id').notNullable().references('id').inTable('credit_notes').onDelete('CASCADE');
    t.integer('invoice_line_id').notNullable().references('id').inTable('invoice_lines').onDelete('RESTRICT');
    t.integer('quantity').notNullable();
    t.integer('unit_price').notNullable();
    t.integer('tax_rate_bp').notNullable();
    t.integer('net').notNullable();
    t.integer('tax').notNullable();
    t.integer('total').notNullable();
    t.index(['credit_note_id']);
    t.index(['invoice_line_id']);
  });

  await knex.schema.createTable('payments', (t) => {
    t.increments('id').primary();
    t.integer('invoice_id').notNullable().references('id').inTable('invoices').onDelete('RESTRICT');
    t.string('method', 20).notNullable();
    t.string('status', 20).notNullable();
    t.integer('amount').notNullable();
    t.string('currency', 3).notNullable();
    t.string('provider_session_id', 120).nullable().unique();
    t.string('provider_payment_id', 120).nullable();
    t.string('checkout_url', 1000).nullable();
    t.string('last_error', 500).nullable();
    // The invoice id while this payment is open, null once it is closed: unique, so an invoice has at
    // most one open card payment however often the button is pressed (NULLs do not collide).
    t.integer('open_for_invoice').nullable().unique();
    t.integer('created_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('paid_at', 30).nullable();
    t.string('created_at', 30).notNullable();
    t.string('updated_at', 30).notNullable();
    t.index(['invoice_id', 'status']);
  });

  // Every provider event handled once: a replayed event finds its id here and changes nothing.
  await knex.schema.createTable('payment_events', (t) => {
    t.string('event_id', 120).primary();
    t.string('type', 80).notNullable();
    t.integer('payment_id').nullable().references('id').inTable('payments').onDelete('SET NULL');
    t.string('received_at', 30).notNullable();
  });

  await knex.schema.createTable('refunds', (t) => {
    t.increments('id').primary();
    t.integer('credit_note_id').notNullable().unique().references('id').inTable('credit_notes').onDelete('RESTRICT');
    t.integer('payment_id').notNullable().references('id').inTable('payments').onDelete('RESTRICT');
    t.integer('amount').notNullable();
    t.string('status', 20).notNullable();
    t.string('provider_refund_id', 120).nullable();
    t.string('last_error', 500).nullable();
    t.string('created_at', 30).notNullable();
    t.string('updated_at', 30).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of [
    'refunds',
    'payment_events',
    'payments',
    'credit_note_lines',
    'credit_notes',
    'invoice_lines',
    'invoices',
    'document_sequences',
    'contractor_accounts',
    'slot_bookings',
    'delivery_slots',
    'lorries',
    'order_comments',
  ]) {
    await knex.schema.dropTableIfExists(table);
  }
  await knex.schema.alterTable('orders', (t) => {
    t.dropIndex([], 'orders_merchant_placed');
    t.dropIndex([], 'orders_merchant_requested');
    t.dropIndex([], 'orders_merchant_updated');
    t.dropIndex([], 'orders_merchant_branch_status');
    t.dropIndex([], 'orders_merchant_contractor_placed');
  });
  // Plain ALTER TABLE … DROP COLUMN (SQLite 3.35+ and PostgreSQL): a table rebuild would trip the
  // foreign keys of the rows that point at these tables.
  await knex.raw('alter table ?? drop column ??', ['order_lines', 'delivered_quantity']);
  await knex.raw('alter table ?? drop column ??', ['products', 'tax_rate_bp']);
}
