import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, peekRow, type Db } from './knex';

let db: Db;
beforeAll(async () => {
  db = createDb(':memory:');
  await db.schema.createTable('counters', (t) => {
    t.integer('id').primary();
    t.integer('n').notNullable();
  });
  await db('counters').insert({ id: 1, n: 5 });
});
afterAll(async () => db.destroy());

const peek = () => peekRow<{ n: number }>(db, 'select n from counters where id = ?', 1);

describe('reading a row straight from the connection', () => {
  it('reads what is committed', async () => {
    expect(peek()).toEqual({ row: { n: 5 } });
    expect(peekRow(db, 'select n from counters where id = ?', 2)).toEqual({ row: undefined });
  });

  it('declines while a transaction is open, so an uncommitted or rolled-back value is never seen', async () => {
    const during: unknown[] = [];
    await db
      .transaction(async (trx) => {
        await trx('counters').where({ id: 1 }).update({ n: 6 });
        during.push(peek());
        throw new Error('roll back');
      })
      .catch(() => {});
    expect(during).toEqual([null]);
    expect(peek()).toEqual({ row: { n: 5 } });
  });

  it('declines before any connection is open', () => {
    const fresh = createDb(':memory:');
    expect(peekRow(fresh, 'select 1')).toBeNull();
    void fresh.destroy();
  });
});
