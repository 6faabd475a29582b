import type { Knex } from 'knex';

/**
 * The merchants' catalogue (products with the engine's technical fields, roof systems, prices and
 * stock per branch), the contractors' sites with their roof schedules and estimates, and the order
 * book both sides share (orders, lines, proposals, timeline) with quote requests.
 *
 * Counts of stock and order quantities are in packs (the unit a merchant sells: one tile, one
 * batten length, one box of nails); money is integer minor units; lengths are millimetres.
 * JSON is stored as text so the same file runs on PostgreSQL.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('products', (t) => {
    t.increments('id').primary();
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.string('sku', 40).notNullable();
    t.string('name', 160).notNullable();
    t.string('category', 30).notNullable();
    t.string('unit', 20).notNullable();
    t.integer('pack_size').notNullable().defaultTo(1);
    t.double('pack_weight_kg').notNullable().defaultTo(0);
    t.text('technical').notNullable().defaultTo('{}');
    t.string('archived_at', 30).nullable();
    t.string('created_at', 30).notNullable();
    t.string('updated_at', 30).notNullable();
    t.unique(['organisation_id', 'sku']);
    t.index(['organisation_id', 'category']);
  });

  await knex.schema.createTable('branch_products', (t) => {
    t.increments('id').primary();
    t.integer('branch_id').notNullable().references('id').inTable('branches').onDelete('CASCADE');
    t.integer('product_id').notNullable().references('id').inTable('products').onDelete('CASCADE');
    t.integer('pack_price').notNullable();
    t.integer('on_hand').notNullable().defaultTo(0);
    t.integer('reserved').notNullable().defaultTo(0);
    t.integer('reorder_level').notNullable().defaultTo(0);
    t.string('updated_at', 30).notNullable();
    t.unique(['branch_id', 'product_id']);
    t.check('?? >= 0', ['pack_price'], 'branch_products_price_not_negative');
    t.check('?? >= 0 and ?? >= 0 and ?? <= ??', ['on_hand', 'reserved', 'reserved', 'on_hand'], 'branch_products_reserved_within_on_hand');
  });

  await knex.schema.createTable('roof_systems', (t) => {
    t.increments('id').primary();
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('branch_id').notNullable().references('id').inTable('branches').onDelete('CASCADE');
    t.string('name', 160).notNullable();
    t.string('description', 500).notNullable().defaultTo('');
    t.text('settings').notNullable().defaultTo('{}');
    t.string('archived_at', 30).nullable();
    t.string('created_at', 30).notNullable();
    t.string('updated_at', 30).notNullable();
    t.index(['branch_id']);
    t.index(['organisation_id']);
  });

  await knex.schema.createTable('roof_system_components', (t) => {
    t.increments('id').primary();
    t.integer('roof_system_id').notNullable().references('id').inTable('roof_systems').onDelete('CASCADE');
    t.string('role', 30).notNullable();
    t.integer('product_id').notNullable().references('id').inTable('products').onDelete('RESTRICT');
    t.unique(['roof_system_id', 'role']);
  });

  await knex.schema.createTable('projects', (t) => {
    t.increments('id').primary();
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.string('name', 160).notNullable();
    t.string('reference', 60).notNullable().defaultTo('');
    t.string('site_address', 400).notNullable();
    t.string('site_postcode', 20).notNullable().defaultTo('');
    t.string('contact_name', 120).notNullable().defaultTo('');
    t.string('contact_phone', 40).notNullable().defaultTo('');
    t.string('vehicle_access', 20).notNullable().defaultTo('any');
    t.string('crane_lift', 20).notNullable().defaultTo('unknown');
    t.string('overhead_lines', 20).notNullable().defaultTo('unknown');
    t.string('set_down_place', 400).notNullable().defaultTo('');
    t.string('access_notes', 2000).notNullable().defaultTo('');
    t.integer('created_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('archived_at', 30).nullable();
    t.string('created_at', 30).notNullable();
    t.string('updated_at', 30).notNullable();
    t.index(['organisation_id', 'archived_at', 'updated_at']);
  });

  await knex.schema.createTable('project_buildings', (t) => {
    t.increments('id').primary();
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.string('name', 100).notNullable();
    t.string('kind', 20).notNullable().defaultTo('building');
    t.string('notes', 500).notNullable().defaultTo('');
    t.index(['project_id']);
  });

  await knex.schema.createTable('schedules', (t) => {
    t.increments('id').primary();
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.integer('version').notNullable();
    t.string('source', 20).notNullable();
    t.string('filename', 200).nullable();
    t.integer('face_count').notNullable();
    t.integer('created_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('created_at', 30).notNullable();
    t.unique(['project_id', 'version']);
  });

  await knex.schema.createTable('schedule_faces', (t) => {
    t.increments('id').primary();
    t.integer('schedule_id').notNullable().references('id').inTable('schedules').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.string('building', 100).notNullable();
    t.string('face', 100).notNullable();
    t.integer('quantity').notNullable();
    t.double('pitch_deg').notNullable();
    t.double('rafter_mm').notNullable();
    t.double('run_mm').notNullable();
    t.double('eaves_mm').notNullable();
    t.double('top_mm').notNullable();
    t.string('left_edge', 20).notNullable();
    t.string('right_edge', 20).notNullable();
    t.string('top_edge', 20).notNullable();
    t.index(['schedule_id', 'position']);
  });

  await knex.schema.createTable('estimates', (t) => {
    t.increments('id').primary();
    t.integer('organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.integer('schedule_id').notNullable().references('id').inTable('schedules').onDelete('RESTRICT');
    t.integer('roof_system_id').nullable().references('id').inTable('roof_systems').onDelete('SET NULL');
    t.integer('branch_id').nullable().references('id').inTable('branches').onDelete('SET NULL');
    t.string('system_name', 160).notNullable();
    t.text('system_input').notNullable();
    t.text('waste_pct').notNullable();
    t.string('engine_version', 20).notNullable();
    t.text('result').notNullable();
    t.integer('subtotal').nullable();
    t.double('weight_kg').notNullable();
    t.integer('pallets').notNullable();
    t.integer('loads').notNullable();
    t.integer('recomputed_from').nullable().references('id').inTable('estimates').onDelete('SET NULL');
    t.integer('created_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('created_at', 30).notNullable();
    t.index(['organisation_id', 'project_id']);
  });

  await knex.schema.createTable('estimate_lines', (t) => {
    t.increments('id').primary();
    t.integer('estimate_id').notNullable().references('id').inTable('estimates').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.string('category', 30).notNullable();
    t.integer('product_id').nullable().references('id').inTable('products').onDelete('SET NULL');
    t.string('sku', 40).nullable();
    t.string('description', 200).notNullable();
    t.double('quantity').notNullable();
    t.string('unit', 20).notNullable();
    t.integer('pack_size').notNullable();
    t.integer('packs').notNullable();
    t.integer('unit_price').nullable();
    t.integer('total').nullable();
    // The engine total the quantity was taken from (tiles_order, batten_lengths...).
    t.string('figure', 30).notNullable();
    t.index(['estimate_id']);
  });

  await knex.schema.createTable('quote_requests', (t) => {
    t.increments('id').primary();
    t.integer('contractor_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.integer('estimate_id').notNullable().references('id').inTable('estimates').onDelete('RESTRICT');
    t.string('status', 20).notNullable();
    t.string('requested_date', 10).notNullable();
    t.string('time_window', 11).nullable();
    t.string('delivery_method', 10).notNullable();
    t.string('po_reference', 60).notNullable().defaultTo('');
    t.string('notes', 2000).notNullable().defaultTo('');
    t.text('site').notNullable();
    t.integer('created_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('created_at', 30).notNullable();
    t.string('updated_at', 30).notNullable();
    t.index(['contractor_organisation_id', 'created_at']);
  });

  await knex.schema.createTable('quote_request_lines', (t) => {
    t.increments('id').primary();
    t.integer('quote_request_id').notNullable().references('id').inTable('quote_requests').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.string('category', 30).notNullable();
    t.string('description', 200).notNullable();
    t.double('quantity').notNullable();
    t.string('unit', 20).notNullable();
    t.index(['quote_request_id']);
  });

  await knex.schema.createTable('quotes', (t) => {
    t.increments('id').primary();
    t.integer('quote_request_id').notNullable().references('id').inTable('quote_requests').onDelete('CASCADE');
    t.integer('merchant_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('branch_id').notNullable().references('id').inTable('branches').onDelete('CASCADE');
    t.string('status', 20).notNullable();
    t.string('message', 2000).notNullable().defaultTo('');
    t.string('valid_until', 10).nullable();
    t.integer('total').nullable();
    t.integer('answered_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('answered_at', 30).nullable();
    t.integer('order_id').nullable();
    t.string('created_at', 30).notNullable();
    t.unique(['quote_request_id', 'branch_id']);
    t.index(['merchant_organisation_id', 'status', 'created_at']);
  });

  await knex.schema.createTable('quote_lines', (t) => {
    t.increments('id').primary();
    t.integer('quote_id').notNullable().references('id').inTable('quotes').onDelete('CASCADE');
    t.integer('quote_request_line_id').notNullable().references('id').inTable('quote_request_lines').onDelete('CASCADE');
    t.integer('product_id').nullable().references('id').inTable('products').onDelete('SET NULL');
    t.string('sku', 40).nullable();
    t.string('description', 200).notNullable();
    t.string('unit', 20).notNullable();
    t.integer('pack_size').notNullable();
    t.integer('packs').notNullable();
    t.integer('unit_price').notNullable();
    t.integer('total').notNullable();
    t.string('note', 500).notNullable().defaultTo('');
    t.unique(['quote_id', 'quote_request_line_id']);
  });

  await knex.schema.createTable('orders', (t) => {
    t.increments('id').primary();
    t.integer('contractor_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('merchant_organisation_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('branch_id').notNullable().references('id').inTable('branches').onDelete('RESTRICT');
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('RESTRICT');
    t.integer('estimate_id').nullable().references('id').inTable('estimates').onDelete('SET NULL');
    t.integer('quote_id').nullable().references('id').inTable('quotes').onDelete('SET NULL');
    t.string('status', 30).notNullable();
    // Bumped by every change to the lines or the delivery asked for; a proposal answers one revision.
    t.integer('revision').notNullable().defaultTo(1);
    t.string('requested_date', 10).notNullable();
    t.string('time_window', 11).nullable();
    t.string('delivery_method', 10).notNullable();
    t.string('po_reference', 60).notNullable().defaultTo('');
    t.string('notes', 2000).notNullable().defaultTo('');
    // The site as it was when the order was sent: the yard works from this even if the site changes later.
    t.string('site_name', 160).notNullable();
    t.text('site').notNullable();
    t.integer('subtotal').notNullable();
    t.integer('placed_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('placed_at', 30).notNullable();
    t.string('confirmed_at', 30).nullable();
    t.string('cancelled_at', 30).nullable();
    t.string('updated_at', 30).notNullable();
    t.index(['contractor_organisation_id', 'placed_at']);
    t.index(['merchant_organisation_id', 'status', 'placed_at']);
    t.index(['branch_id', 'requested_date']);
  });

  await knex.schema.createTable('order_lines', (t) => {
    t.increments('id').primary();
    t.integer('order_id').notNullable().references('id').inTable('orders').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.integer('product_id').notNullable().references('id').inTable('products').onDelete('RESTRICT');
    t.string('sku', 40).notNullable();
    t.string('description', 200).notNullable();
    t.string('category', 30).notNullable();
    t.string('unit', 20).notNullable();
    t.integer('pack_size').notNullable();
    t.double('pack_weight_kg').notNullable();
    // Packs asked for, then what the desk confirms, back-orders and holds from stock.
    t.integer('quantity').notNullable();
    t.integer('confirmed_quantity').nullable();
    t.integer('back_order_quantity').notNullable().defaultTo(0);
    t.integer('reserved_quantity').notNullable().defaultTo(0);
    t.integer('unit_price').notNullable();
    t.integer('total').notNullable();
    t.string('status', 30).notNullable();
    // A line that came in as an accepted substitute names the line it replaces.
    t.integer('replaces_line_id').nullable().references('id').inTable('order_lines').onDelete('SET NULL');
    t.index(['order_id', 'position']);
    t.index(['product_id']);
    t.check('?? > 0', ['quantity'], 'order_lines_quantity_positive');
  });

  await knex.schema.createTable('order_proposals', (t) => {
    t.increments('id').primary();
    t.integer('order_id').notNullable().references('id').inTable('orders').onDelete('CASCADE');
    t.integer('order_revision').notNullable();
    t.string('status', 20).notNullable();
    t.string('message', 2000).notNullable().defaultTo('');
    t.string('proposed_date', 10).nullable();
    t.string('proposed_time_window', 11).nullable();
    // Left for the delivery calendar, which books a proposed slot by id.
    t.integer('proposed_slot_id').nullable();
    t.integer('proposed_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('proposed_at', 30).notNullable();
    t.integer('answered_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('answered_at', 30).nullable();
    t.index(['order_id', 'status']);
  });

  await knex.schema.createTable('order_proposal_lines', (t) => {
    t.increments('id').primary();
    t.integer('proposal_id').notNullable().references('id').inTable('order_proposals').onDelete('CASCADE');
    t.integer('order_line_id').notNullable().references('id').inTable('order_lines').onDelete('CASCADE');
    t.integer('confirmed_quantity').notNullable();
    t.integer('back_order_quantity').notNullable().defaultTo(0);
    t.integer('substitute_product_id').nullable().references('id').inTable('products').onDelete('RESTRICT');
    t.integer('substitute_quantity').nullable();
    t.integer('substitute_unit_price').nullable();
    t.string('note', 500).notNullable().defaultTo('');
    t.unique(['proposal_id', 'order_line_id']);
  });

  await knex.schema.createTable('order_events', (t) => {
    t.increments('id').primary();
    t.integer('order_id').notNullable().references('id').inTable('orders').onDelete('CASCADE');
    t.string('kind', 40).notNullable();
    t.integer('actor_user_id').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('actor_name', 120).notNullable();
    t.integer('actor_organisation_id').nullable().references('id').inTable('organisations').onDelete('SET NULL');
    t.string('summary', 500).notNullable();
    t.text('data').notNullable().defaultTo('{}');
    t.string('created_at', 30).notNullable();
    t.index(['order_id', 'id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of [
    'order_events',
    'order_proposal_lines',
    'order_proposals',
    'order_lines',
    'orders',
    'quote_lines',
    'quotes',
    'quote_request_lines',
    'quote_requests',
    'estimate_lines',
    'estimates',
    'schedule_faces',
    'schedules',
    'project_buildings',
    'projects',
    'roof_system_components',
    'roof_systems',
    'branch_products',
    'products',
  ]) {
    await knex.schema.dropTableIfExists(table);
  }
}
