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

/** The same counters on PostgreSQL, whose triggers call a function (same names, same moments). */
const PG_FUNCTIONS = `
  CREATE FUNCTION order_book_bump_order() RETURNS trigger LANGUAGE plpgsql AS $$
  DECLARE r orders%ROWTYPE;
  BEGIN
    IF TG_OP = 'DELETE' THEN r := OLD; ELSE r := NEW; END IF;
    INSERT INTO order_book_versions (organisation_id, version) VALUES (r.merchant_organisation_id, 1), (r.contractor_organisation_id, 1)
      ON CONFLICT (organisation_id) DO UPDATE SET version = order_book_versions.version + 1;
    RETURN NULL;
  END $$;
  CREATE FUNCTION order_book_bump_line() RETURNS trigger LANGUAGE plpgsql AS $$
  DECLARE oid integer;
  BEGIN
    IF TG_OP = 'DELETE' THEN oid := OLD.order_id; ELSE oid := NEW.order_id; END IF;
    INSERT INTO order_book_versions (organisation_id, version)
      SELECT o.merchant_organisation_id, 1 FROM orders o WHERE o.id = oid
      UNION SELECT o.contractor_organisation_id, 1 FROM orders o WHERE o.id = oid
      ON CONFLICT (organisation_id) DO UPDATE SET version = order_book_versions.version + 1;
    RETURN NULL;
  END $$;
  CREATE FUNCTION order_book_bump_everyone() RETURNS trigger LANGUAGE plpgsql AS $$
  BEGIN
    INSERT INTO order_book_versions (organisation_id, version) SELECT id, 1 FROM organisations
      ON CONFLICT (organisation_id) DO UPDATE SET version = order_book_versions.version + 1;
    RETURN NULL;
  END $$;`;

const PG_TRIGGERS: [name: string, table: string, sql: string][] = [
  ['order_book_orders_insert', 'orders', 'AFTER INSERT ON orders FOR EACH ROW EXECUTE FUNCTION order_book_bump_order()'],
  ['order_book_orders_update', 'orders', 'AFTER UPDATE ON orders FOR EACH ROW EXECUTE FUNCTION order_book_bump_order()'],
  ['order_book_orders_delete', 'orders', 'AFTER DELETE ON orders FOR EACH ROW EXECUTE FUNCTION order_book_bump_order()'],
  ['order_book_lines_insert', 'order_lines', 'AFTER INSERT ON order_lines FOR EACH ROW EXECUTE FUNCTION order_book_bump_line()'],
  ['order_book_lines_delete', 'order_lines', 'AFTER DELETE ON order_lines FOR EACH ROW EXECUTE FUNCTION order_book_bump_line()'],
  ['order_book_organisation_renamed', 'organisations', 'AFTER UPDATE OF name ON organisations FOR EACH STATEMENT EXECUTE FUNCTION order_book_bump_everyone()'],
  ['order_book_branch_renamed', 'branches', 'AFTER UPDATE OF name, town ON branches FOR EACH STATEMENT EXECUTE FUNCTION order_book_bump_everyone()'],
];

const isPostgres = (knex: Knex) => ['pg', 'postgres', 'postgresql'].includes(String(knex.client.config.client));

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('order_book_versions', (t) => {
    t.integer('organisation_id').primary().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('version').notNullable();
  });
  // A row for every organisation there already is, so the first change to any of them moves a number.
  await knex.raw('INSERT INTO order_book_versions (organisation_id, version) SELECT id, 1 FROM organisations');
  if (isPostgres(knex)) {
    await knex.raw(PG_FUNCTIONS);
    for (const [name, , body] of PG_TRIGGERS) await knex.raw(`CREATE TRIGGER ${name} ${body}`);
    return;
  }
  for (const [name, body] of TRIGGERS) await knex.raw(`CREATE TRIGGER ${name} ${body}`);
}

export async function down(knex: Knex): Promise<void> {
  if (isPostgres(knex)) {
    for (const [name, table] of PG_TRIGGERS) await knex.raw(`DROP TRIGGER IF EXISTS ${name} ON ${table}`);
    await knex.raw('DROP FUNCTION IF EXISTS order_book_bump_order(), order_book_bump_line(), order_book_bump_everyone()');
  } else {
    for (const [name] of TRIGGERS) await knex.raw(`DROP TRIGGER IF EXISTS ${name}`);
  }
  await knex.schema.dropTableIfExists('order_book_versions');
}
