import { describe, expect, it } from 'vitest';
import { createDb, migrateLatest } from './knex';

describe('the migrations', () => {
  it('run forward, all the way back, and forward again on an empty database', async () => {
    const db = createDb(':memory:');
    try {
      await migrateLatest(db);
      const tables = async () => ((await db.raw("select name from sqlite_master where type = 'table' and name not like 'knex_%' and name not like 'sqlite_%'")) as { name: string }[]).map((r) => r.name).sort();
      const triggers = async () => ((await db.raw("select name from sqlite_master where type = 'trigger'")) as { name: string }[]).map((r) => r.name).sort();
      const before = { tables: await tables(), triggers: await triggers() };
      expect(before.tables).toContain('orders');
      expect(before.triggers).toContain('order_book_orders_update');
      await db.migrate.rollback(undefined, true);
      expect(await tables()).toEqual([]);
      await migrateLatest(db);
      expect({ tables: await tables(), triggers: await triggers() }).toEqual(before);
    } finally {
      await db.destroy();
    }
  });
});
