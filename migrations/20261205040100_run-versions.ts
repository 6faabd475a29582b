import type { Knex } from 'knex';

/**
 * A change counter per merchant for everything a run shows beside its orders (which the order-book
 * counter already follows): its slot, lorry and driver, its bookings and drop order, the pallets
 * ticked loaded, and the quantities on its orders' lines. Triggers bump it whichever code path
 * writes, so a day plan kept in memory is known to be stale without any caller remembering.
 */
const BUMP = (org: string) => `
    INSERT INTO run_versions (organisation_id, version) ${org}
      ON CONFLICT (organisation_id) DO UPDATE SET version = version + 1;`;

const bySlot = (row: 'NEW' | 'OLD') => BUMP(`SELECT s.organisation_id, 1 FROM delivery_slots s WHERE s.id = ${row}.slot_id`);
const byOrder = (row: 'NEW' | 'OLD') => BUMP(`SELECT o.merchant_organisation_id, 1 FROM orders o WHERE o.id = ${row}.order_id`);
const byOrg = (row: 'NEW' | 'OLD') => BUMP(`VALUES (${row}.organisation_id, 1)`);

const TRIGGERS: [name: string, sql: string][] = [
  ['run_versions_slots_insert', `AFTER INSERT ON delivery_slots BEGIN ${byOrg('NEW')} END`],
  ['run_versions_slots_update', `AFTER UPDATE ON delivery_slots BEGIN ${byOrg('NEW')} END`],
  ['run_versions_slots_delete', `AFTER DELETE ON delivery_slots BEGIN ${byOrg('OLD')} END`],
  ['run_versions_lorries_update', `AFTER UPDATE ON lorries BEGIN ${byOrg('NEW')} END`],
  ['run_versions_bookings_insert', `AFTER INSERT ON slot_bookings BEGIN ${bySlot('NEW')} END`],
  ['run_versions_bookings_update', `AFTER UPDATE ON slot_bookings BEGIN ${bySlot('NEW')} END`],
  ['run_versions_bookings_delete', `AFTER DELETE ON slot_bookings BEGIN ${bySlot('OLD')} END`],
  ['run_versions_loaded_insert', `AFTER INSERT ON run_loaded_pallets BEGIN ${bySlot('NEW')} END`],
  ['run_versions_loaded_delete', `AFTER DELETE ON run_loaded_pallets BEGIN ${bySlot('OLD')} END`],
  ['run_versions_lines_update', `AFTER UPDATE ON order_lines BEGIN ${byOrder('NEW')} END`],
  ['run_versions_users_renamed', `AFTER UPDATE OF name ON users BEGIN ${byOrg('NEW')} END`],
  ['run_versions_products_footprint', `AFTER UPDATE OF pallet_length_mm, pallet_width_mm ON products BEGIN ${byOrg('NEW')} END`],
];

const isPostgres = (knex: Knex) => ['pg', 'postgres', 'postgresql'].includes(String(knex.client.config.client));

/**
 * The same triggers on PostgreSQL: each body becomes a row-level trigger function (NEW and OLD are
 * the same records there), with the counter column named through its table.
 */
function postgresTrigger(name: string, body: string): { fn: string; trigger: string; table: string } {
  const m = /^(AFTER .+? ON (\w+)) BEGIN ([\s\S]*) END$/.exec(body);
  if (!m) throw new Error(`cannot translate trigger ${name}`);
  const [, when, table, statements] = m as unknown as [string, string, string, string];
  const pgStatements = statements.replace(/SET version = version \+ 1/g, 'SET version = run_versions.version + 1');
  return {
    table,
    fn: `CREATE FUNCTION ${name}_fn() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN ${pgStatements} RETURN NULL; END $$`,
    trigger: `CREATE TRIGGER ${name} ${when} FOR EACH ROW EXECUTE FUNCTION ${name}_fn()`,
  };
}

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('run_versions', (t) => {
    t.integer('organisation_id').primary().references('id').inTable('organisations').onDelete('CASCADE');
    t.integer('version').notNullable();
  });
  for (const [name, body] of TRIGGERS) {
    if (isPostgres(knex)) {
      const pg = postgresTrigger(name, body);
      await knex.raw(pg.fn);
      await knex.raw(pg.trigger);
    } else {
      await knex.raw(`CREATE TRIGGER ${name} ${body}`);
    }
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const [name, body] of TRIGGERS) {
    if (isPostgres(knex)) {
      await knex.raw(`DROP TRIGGER IF EXISTS ${name} ON ${postgresTrigger(name, body).table}`);
      await knex.raw(`DROP FUNCTION IF EXISTS ${name}_fn()`);
    } else {
      await knex.raw(`DROP TRIGGER IF EXISTS ${name}`);
    }
  }
  await knex.schema.dropTableIfExists('run_versions');
}
