import knexFactory, { type Knex } from 'knex';
import { MigrationSource } from './migration-source';

export type Db = Knex;

/**
 * SQLite through better-sqlite3: WAL so readers never wait on the writer, foreign keys enforced,
 * and a busy timeout so concurrent writers queue instead of failing.
 */
export function createDb(filename: string): Db {
  return knexFactory({
    client: 'better-sqlite3',
    connection: { filename },
    useNullAsDefault: true,
    // One connection: SQLite has one writer, and better-sqlite3 is synchronous, so a second
    // connection would block the event loop on a lock. Inside a transaction use only `trx`:
    // a query on `db` there waits for the connection the transaction holds.
    acquireConnectionTimeout: 10_000,
    pool: {
      min: 1,
      max: 1,
      afterCreate(conn: Connection, done: (err: Error | null, conn: unknown) => void) {
        try {
          cachePreparedStatements(conn);
          conn.pragma('journal_mode = WAL');
          conn.pragma('foreign_keys = ON');
          conn.pragma('busy_timeout = 5000');
          conn.pragma('synchronous = NORMAL');
          done(null, conn);
        } catch (err) {
          done(err as Error, conn);
        }
      },
    },
    migrations: { migrationSource: new MigrationSource() },
  });
}

interface Connection {
  pragma: (s: string) => unknown;
  prepare: (sql: string) => unknown;
}

const STATEMENT_CACHE_SIZE = 1000;

/**
 * Knex prepares every query anew, and preparing costs about as much as running a small indexed
 * query. The app issues a few hundred distinct SQL texts (values travel as bindings), so keeping
 * the prepared statements makes every query cheaper. SQLite re-prepares a cached statement by itself
 * after a schema change.
 */
function cachePreparedStatements(conn: Connection): void {
  const prepare = conn.prepare.bind(conn);
  const cache = new Map<string, unknown>();
  conn.prepare = (sql: string) => {
    let statement = cache.get(sql);
    if (statement === undefined) {
      statement = prepare(sql);
      if (cache.size >= STATEMENT_CACHE_SIZE) cache.delete(cache.keys().next().value as string);
      cache.set(sql, statement);
    }
    return statement;
  };
}

export async function migrateLatest(db: Db): Promise<void> {
  await db.migrate.latest();
}
