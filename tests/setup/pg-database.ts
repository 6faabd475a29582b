import { randomBytes } from 'node:crypto';
import knexFactory from 'knex';
import { inject } from 'vitest';

/**
 * A new database in the suite's throw-away PostgreSQL cluster, dropped by drop(): empty, or with
 * `migrated` a copy of the cluster's migrated template (tests/setup/pg-global.ts), which is what
 * running every migration on the empty one would give, in a fraction of the time.
 */
export async function createTestPgDatabase(options: { migrated?: boolean } = {}): Promise<{ url: string; drop: () => Promise<void> }> {
  const adminUrl = inject('pgAdminUrl');
  if (!adminUrl) throw new Error('TEST_DB=postgres needs the PostgreSQL cluster of tests/setup/pg-global.ts');
  const template = options.migrated ? inject('pgTemplate') : undefined;
  if (options.migrated && !template) throw new Error('A migrated PostgreSQL test database needs the template of tests/setup/pg-global.ts');
  const name = `ridgeload_${process.pid}_${randomBytes(4).toString('hex')}`;
  const admin = knexFactory({ client: 'pg', connection: adminUrl, pool: { min: 0, max: 1 } });
  try {
    await admin.raw(template ? `CREATE DATABASE ${name} TEMPLATE ${template}` : `CREATE DATABASE ${name}`);
  } finally {
    await admin.destroy();
  }
  const url = adminUrl.replace(/\/postgres$/, `/${name}`);
  return {
    url,
    async drop() {
      const a = knexFactory({ client: 'pg', connection: adminUrl, pool: { min: 0, max: 1 } });
      try {
        await a.raw(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      } finally {
        await a.destroy();
      }
    },
  };
}
