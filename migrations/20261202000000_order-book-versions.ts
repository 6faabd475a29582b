import type { Knex } from 'knex';

/**
 * A change counter per organisation for everything an order-book row shows. Triggers bump it on every
 * write to an order, on every line added or removed, and on any rename of an organisation or branch,
 * so a cached page of the book is known to be stale whichever code path wrote — no caller has to
 * remember to invalidate it.
 */
const PARTIES = (row: 'NEW' | 'OLD') => `
    INSERT INTO order_book_versions (organisation_id, version) VALUES (${row}.merchant_organisation_id, 1)
      ON CONFLICT (organisation_id) DO UPDATE SET version = version + 1;
    INSERT INTO order_book_versions (organisation_id, version) VALUES (${row}.contractor_organisation_id, 1)
      ON CONFLICT (organisation_id) DO UPDATE SET version = version + 1;`;

const LINE_PARTIES = (row: 'NEW' | 'OLD') => `
    INSERT INTO order_book_versions (organisation_id, version)
      SELECT o.merchant_organisation_id, 1 FROM orders o WHERE o.id = ${row}.order_id
      UNION SELECT o.contractor_organisation_id, 1 FROM orders o WHERE o.id = ${row}.order_id
      ON CONFLICT (organisation_id) DO UPDATE SET version = version + 1;`;

// Every organisation, with or without a row yet (a row may be missing for one with no orders since).
const EVERYONE = `
    INSERT INTO order_book_versions (organisation_id, version) SELECT id, 1 FROM organisations WHERE true
      ON CONFLICT (organisation_id) DO UPDATE SET version = version + 1;`;

const TRIGGERS: [name: string, sql: string][] = [
  ['order_book_orders_insert', `AFTER INSERT ON orders BEGIN ${PARTIES('NEW')} END`],
  ['order_book_orders_update', `AFTER UPDATE ON orders BEGIN ${PARTIES('NEW')} END`],
  ['order_book_orders_delete', `AFTER DELETE ON orders BEGIN ${PARTIES('OLD')} END`],
  ['order_book_lines_insert', `AFTER INSERT ON order_lines BEGIN ${LINE_PARTIES('NEW')} END`],
  ['order_book_lines_delete', `AFTER DELETE ON order_lines BEGIN ${LINE_PARTIES('OLD')} END`],
  ['order_book_organisation_renamed', `AFTER UPDATE OF name ON organisations BEGIN ${EVERYONE} END`],
  ['order_book_branch_renamed', `AFTER UPDATE OF name, town ON branches BEGIN ${EVERYONE} END`],
];

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('order_book_versions', (t) => {
    t.integer('organisation_id').primary().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('version').notNullable();
  });
  // A row for every organisation there already is, so the first change to any of them moves a number.
  await knex.raw('INSERT INTO order_book_versions (organisation_id, version) SELECT id, 1 FROM organisations');
  for (const [name, body] of TRIGGERS) await knex.raw(`CREATE TRIGGER ${name} ${body}`);
}

export async function down(knex: Knex): Promise<void> {
  for (const [name] of TRIGGERS) await knex.raw(`DROP TRIGGER IF EXISTS ${name}`);
  await knex.schema.dropTableIfExists('order_book_versions');
}
