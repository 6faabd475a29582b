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
      afterCreate(conn: { pragma: (s: string) => unknown }, done: (err: Error | null, conn: unknown) => void) {
        try {
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

export async function migrateLatest(db: Db): Promise<void> {
  await db.migrate.latest();
}
