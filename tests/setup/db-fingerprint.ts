import { createHash } from 'node:crypto';
import { dialectOf } from '../../server/db/dialect';
import type { Db } from '../../server/db/knex';

/** The app's tables on either database, by name (migration bookkeeping and the given ones left out). */
async function tableNames(db: Db, leaveOut: readonly string[]): Promise<string[]> {
  const names =
    dialectOf(db) === 'postgres'
      ? ((await db('information_schema.tables').where({ table_schema: 'public', table_type: 'BASE TABLE' }).pluck('table_name')) as string[])
      : ((await db('sqlite_master').where({ type: 'table' }).pluck('name')) as string[]);
  return names.filter((n) => !n.startsWith('knex_') && n !== 'sqlite_sequence' && !leaveOut.includes(n)).sort();
}

/** One table's rows (optionally some of them) as a hash, in an order that does not depend on the database. */
export async function tableFingerprint(db: Db, table: string, where: Record<string, unknown> = {}): Promise<string> {
  const rows = ((await db(table).where(where).select('*')) as unknown[]).map((r) => JSON.stringify(r)).sort();
  return createHash('sha256').update(rows.join('\n')).digest('hex');
}

/**
 * Everything the API can change, as one hash: a test takes it before and after and compares.
 * Sessions and the rate limits' counters of tries are bookkeeping of requests, not records, and are left out.
 */
export async function databaseFingerprint(db: Db, leaveOut: readonly string[] = ['sessions', 'rate_limit_hits']): Promise<string> {
  const h = createHash('sha256');
  for (const name of await tableNames(db, leaveOut)) h.update(name).update(await tableFingerprint(db, name));
  return h.digest('hex');
}
