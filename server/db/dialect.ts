import type { Knex } from 'knex';

export type Dialect = 'sqlite' | 'postgres';

/** Which database a knex instance (or transaction) talks to. */
export function dialectOf(db: Knex): Dialect {
  const client = String((db.client as { config?: { client?: unknown } }).config?.client ?? '');
  return client === 'pg' || client === 'postgres' || client === 'postgresql' ? 'postgres' : 'sqlite';
}

/**
 * SQL for one text field of a JSON document kept in a text column (`column` is an identifier,
 * bound with ??): json_extract on SQLite, the ->> operator on PostgreSQL.
 */
export function jsonTextSql(db: Knex, path: readonly string[]): string {
  if (dialectOf(db) === 'postgres') return `(??::jsonb #>> '{${path.join(',')}}')`;
  return `json_extract(??, '$.${path.join('.')}')`;
}

/**
 * Holds one row for the rest of the transaction, so a check made on it (is there a follow-up yet,
 * is a payment open) stays true until the write that depends on it. PostgreSQL takes a row lock;
 * SQLite needs none, since its one writer already runs the whole transaction alone.
 */
export async function lockRow(trx: Knex, table: string, id: number): Promise<void> {
  if (dialectOf(trx) === 'postgres') await trx(table).where('id', id).forUpdate().first('id');
}

/** A unique or primary-key constraint refused the write (on either database). */
export function isUniqueViolation(err: unknown): boolean {
  const code = (err as { code?: unknown } | null)?.code;
  return code === '23505' || code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY';
}
