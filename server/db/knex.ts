import { createRequire } from 'node:module';
import knexFactory, { type Knex } from 'knex';
import type pgModule from 'pg';
import { dialectOf } from './dialect';
import { MigrationSource } from './migration-source';

export type Db = Knex;

/** True for a PostgreSQL connection string (postgres:// or postgresql://). */
export const isPostgresUrl = (target: string) => /^postgres(ql)?:\/\//i.test(target);

/**
 * The database: a PostgreSQL connection string selects PostgreSQL (for more than one server);
 * anything else is the path of a SQLite file (the zero-setup default).
 */
export function createDb(target: string): Db {
  return isPostgresUrl(target) ? createPostgresDb(target) : createSqliteDb(target);
}

const require = createRequire(import.meta.url);

function createPostgresDb(url: string): Db {
  // pg is loaded only for PostgreSQL, so a SQLite server never carries it. Counts and sums come back
  // from PostgreSQL as 64-bit integers or numerics, which pg hands out as strings; every number the
  // app keeps (minor units, kg, packs) fits a double exactly.
  const pg = require('pg') as typeof pgModule;
  pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number(v));
  pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => Number(v));
  const db = knexFactory({
    client: 'pg',
    connection: url,
    pool: { min: 0, max: Number(process.env.DATABASE_POOL_MAX ?? 10) },
    acquireConnectionTimeout: 10_000,
    migrations: { migrationSource: new MigrationSource() },
  });
  retryTransactionsOnConflict(db);
  return db;
}

/** PostgreSQL gave the transaction up for another's sake: a serialization failure or a deadlock. */
export function isTransactionConflict(err: unknown): boolean {
  const code = (err as { code?: unknown } | null)?.code;
  return code === '40001' || code === '40P01';
}

const TRANSACTION_ATTEMPTS = 4;

/**
 * When PostgreSQL ends a transaction as a deadlock's victim (40P01) or for a serialization failure
 * (40001), everything it did was rolled back and running it again is the documented remedy. So every
 * `db.transaction(handler)` runs the handler again, up to four times in all, after a short random
 * pause that lets the winner finish. Handlers only touch the database (mail and other effects
 * happen after the commit), so a second run is safe. A conflict that outlasts the attempts reaches
 * the error handler, which answers 503 with Retry-After.
 */
function retryTransactionsOnConflict(db: Db): void {
  const transaction = db.transaction.bind(db) as (...args: unknown[]) => Promise<unknown>;
  const retrying = (handler?: unknown, ...rest: unknown[]) => {
    if (typeof handler !== 'function') return transaction(handler, ...rest);
    return (async () => {
      for (let attempt = 1; ; attempt++) {
        try {
          return await transaction(handler, ...rest);
        } catch (err) {
          if (!isTransactionConflict(err) || attempt >= TRANSACTION_ATTEMPTS) throw err;
          await new Promise((r) => setTimeout(r, 5 + Math.random() * 20 * attempt));
        }
      }
    })();
  };
  // knex defines its methods as read-only properties of the instance; this one is replaced in place.
  Object.defineProperty(db, 'transaction', { value: retrying, configurable: true });
}

/**
 * SQLite through better-sqlite3: WAL so readers never wait on the writer, foreign keys enforced,
 * and a busy timeout so concurrent writers queue instead of failing.
 */
function createSqliteDb(filename: string): Db {
  const open: { connection?: Connection } = {};
  const db = knexFactory({
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
          open.connection = conn;
          done(null, conn);
        } catch (err) {
          done(err as Error, conn);
        }
      },
    },
    migrations: { migrationSource: new MigrationSource() },
  });
  openConnections.set(db, open);
  return db;
}

interface Statement {
  get: (...params: unknown[]) => unknown;
}

interface Connection {
  open: boolean;
  inTransaction: boolean;
  pragma: (s: string) => unknown;
  prepare: (sql: string) => Statement;
}

const openConnections = new WeakMap<Db, { connection?: Connection }>();

/**
 * One row read straight from the open connection, without knex's query building and pool hand-over
 * (which cost several times the read itself on the busiest paths). better-sqlite3 runs it at once on
 * the app's one connection, so it is only done when no transaction is open there: it then sees
 * exactly what is committed. Returns `{ row }`, or null when a transaction is open or no connection
 * is open yet — then ask through knex, which waits for the transaction to end.
 */
export function peekRow<T>(db: Db, sql: string, ...params: unknown[]): { row: T | undefined } | null {
  const conn = openConnections.get(db)?.connection;
  if (!conn?.open || conn.inTransaction) return null;
  return { row: conn.prepare(sql).get(...params) as T | undefined };
}

/** The part of knex's client that hands out and takes back pooled connections (node-postgres clients on PostgreSQL). */
interface PooledClient {
  acquireConnection: () => Promise<{ query: (q: { name: string; text: string; values: unknown[] }) => Promise<{ rows: unknown[] }> }>;
  releaseConnection: (conn: unknown) => Promise<unknown>;
}

/**
 * One row read on PostgreSQL through a pooled connection, without knex's query building, bindings
 * rewriting and query events (on the busiest path they cost more than the round trip's own work in
 * this process). `sql` uses PostgreSQL's own placeholders ($1, $2…). It runs as a prepared statement
 * named `name` (one name per SQL text): each connection parses and plans it once, then only binds
 * and runs it. Rows are parsed as knex's are (the same node-postgres type parsers).
 */
export async function pgRow<T>(db: Db, name: string, sql: string, ...params: unknown[]): Promise<T | undefined> {
  const client = db.client as unknown as PooledClient;
  const conn = await client.acquireConnection();
  try {
    return (await conn.query({ name, text: sql, values: params })).rows[0] as T | undefined;
  } finally {
    await client.releaseConnection(conn);
  }
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
  const cache = new Map<string, Statement>();
  conn.prepare = (text: string) => {
    // Every transaction takes the write lock when it begins: a deferred one that reads and then
    // writes fails at once with SQLITE_BUSY when another process wrote in between, whatever the busy
    // timeout; an immediate one waits its turn, SQLite's busy handler retrying for up to the busy
    // timeout, and only then fails (answered 503 with Retry-After by the error handler).
    const sql = text === 'BEGIN;' ? 'BEGIN IMMEDIATE;' : text;
    let statement = cache.get(sql);
    if (statement === undefined) {
      statement = prepare(sql);
      if (cache.size >= STATEMENT_CACHE_SIZE) cache.delete(cache.keys().next().value as string);
      cache.set(sql, statement);
    }
    return statement;
  };
}

/** Any fixed number, the same in every server: the advisory lock that lets one server migrate at a time. */
const MIGRATION_LOCK = 7_301_202_612;

/**
 * Brings the database to the latest migration. Servers starting together on one PostgreSQL database
 * each try, and knex alone would let them trip over each other (creating its own tables twice, or
 * refusing with MigrationLocked), so on PostgreSQL each first takes an advisory lock, held by a
 * transaction of its own while the migrations run on the pool's other connections: the others wait
 * for it and then find nothing left to do.
 */
export async function migrateLatest(db: Db): Promise<void> {
  if (dialectOf(db) !== 'postgres') {
    await db.migrate.latest();
    return;
  }
  await db.transaction(async (trx) => {
    await trx.raw('select pg_advisory_xact_lock(?)', [MIGRATION_LOCK]);
    await db.migrate.latest();
  });
}
