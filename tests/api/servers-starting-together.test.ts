import { describe, expect, it } from 'vitest';
import { createDb, migrateLatest } from '../../server/db/knex';
import { createTestPgDatabase } from '../setup/pg-database';

// Servers started together on a new PostgreSQL database all migrate it at start-up: one does the
// work and the others wait for it, rather than stopping with "Migration table is already locked".
describe.skipIf(process.env.TEST_DB !== 'postgres')('three servers starting together on an empty PostgreSQL database', () => {
  it('all start: one migrates and the others wait, and every migration runs once', async () => {
    const database = await createTestPgDatabase();
    const servers = [0, 1, 2].map(() => createDb(database.url));
    try {
      const outcomes = await Promise.allSettled(servers.map((db) => migrateLatest(db)));
      expect(outcomes.map((o) => (o.status === 'rejected' ? String(o.reason) : 'started'))).toEqual(['started', 'started', 'started']);
      const names = (await servers[0]('knex_migrations').pluck('name')) as string[];
      expect(names.length).toBeGreaterThan(10);
      expect(new Set(names).size).toBe(names.length);
    } finally {
      await Promise.all(servers.map((db) => db.destroy()));
      await database.drop();
    }
  }, 120_000);
});
