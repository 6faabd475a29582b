import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dialectOf } from '../../server/db/dialect';
import { createDb, type Db } from '../../server/db/knex';
import { createTestApp, type TestApp } from '../setup/test-app';

// PostgreSQL ends one of two transactions that wait on each other's rows (a deadlock, 40P01);
// SQLite has one writer, so there the same pair simply runs one after the other.
let t: TestApp;
let other: Db;
beforeAll(async () => {
  t = await createTestApp();
  // A second pool, as a second server has.
  other = createDb(t.config.database);
  await t.db.schema.createTable('conflict_counters', (c) => {
    c.integer('id').primary();
    c.integer('n').notNullable();
  });
  await t.db('conflict_counters').insert([
    { id: 1, n: 0 },
    { id: 2, n: 0 },
  ]);
});
afterAll(async () => {
  await other?.destroy();
  await t?.close();
});

describe.skipIf(process.env.TEST_DB !== 'postgres')('transactions that deadlock on PostgreSQL', () => {
  it('runs the deadlock victim again, so both writers succeed and no increment is lost', async () => {
    expect(dialectOf(t.db)).toBe('postgres');
    let runs = 0;
    // Each holds one row and then asks for the other's; both reach the second step before either ends.
    let arrived = 0;
    let release!: () => void;
    const bothHoldOne = new Promise<void>((r) => (release = r));
    const crossing = (db: Db, first: number, second: number) =>
      db.transaction(async (trx) => {
        runs++;
        await trx('conflict_counters').where({ id: first }).increment('n', 1);
        if (++arrived === 2) release();
        await bothHoldOne;
        await trx('conflict_counters').where({ id: second }).increment('n', 1);
      });
    await Promise.all([crossing(t.db, 1, 2), crossing(other, 2, 1)]);
    expect(runs).toBe(3); // the victim ran twice
    expect((await t.db('conflict_counters').orderBy('id').pluck('n')).map(Number)).toEqual([2, 2]);
  });
});
