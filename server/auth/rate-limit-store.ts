import { createHash } from 'node:crypto';
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { Db } from '../db/knex';

const TABLE = 'rate_limit_hits';

/**
 * express-rate-limit's counters in the database (table `rate_limit_hits`), so that every server on
 * one database counts the same tries against one limit. Each hit is one statement, an insert that
 * on a clash adds one to the row, or starts the window again when it has ended, and returns the
 * row as it now stands: atomic on SQLite (one writer) and on PostgreSQL (the upsert locks the row),
 * whichever server the tries arrive at. Rows whose window has ended are swept once a window.
 */
export class DbRateLimitStore implements Store {
  /** Counts are shared between processes, so the library must not assume they are kept here alone. */
  readonly localKeys = false;
  private windowMs = 60_000;
  private lastSweep = Date.now();

  constructor(
    private readonly db: Db,
    /** Names the limit, so two limits never share a row for the same client. */
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  private rowKey(key: string): string {
    return `${this.prefix}:${createHash('sha256').update(key).digest('base64url')}`;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = (await this.db(TABLE)
      .where({ key: this.rowKey(key) })
      .first('hits', 'reset_at')) as Row | undefined;
    if (!row || row.reset_at <= new Date().toISOString()) return undefined;
    return { totalHits: Number(row.hits), resetTime: new Date(row.reset_at) };
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const now = new Date();
    const nowIso = now.toISOString();
    const resetAt = new Date(now.getTime() + this.windowMs).toISOString();
    const result: unknown = await this.db.raw(
      `INSERT INTO ${TABLE} (key, hits, reset_at) VALUES (?, 1, ?)
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN ${TABLE}.reset_at <= ? THEN 1 ELSE ${TABLE}.hits + 1 END,
         reset_at = CASE WHEN ${TABLE}.reset_at <= ? THEN excluded.reset_at ELSE ${TABLE}.reset_at END
       RETURNING hits, reset_at`,
      [this.rowKey(key), resetAt, nowIso, nowIso],
    );
    // PostgreSQL answers { rows }, better-sqlite3 the rows themselves.
    const rows = (Array.isArray(result) ? result : (result as { rows: Row[] }).rows) as Row[];
    await this.sweep(now.getTime());
    return { totalHits: Number(rows[0].hits), resetTime: new Date(rows[0].reset_at) };
  }

  async decrement(key: string): Promise<void> {
    await this.db(TABLE)
      .where({ key: this.rowKey(key) })
      .where('hits', '>', 0)
      .where('reset_at', '>', new Date().toISOString())
      .update({ hits: this.db.raw('?? - 1', ['hits']) });
  }

  async resetKey(key: string): Promise<void> {
    await this.db(TABLE)
      .where({ key: this.rowKey(key) })
      .delete();
  }

  async resetAll(): Promise<void> {
    await this.db(TABLE).where('key', 'like', `${this.prefix}:%`).delete();
  }

  /** Forgets windows that have ended, at most once a window per server. */
  private async sweep(now: number): Promise<void> {
    if (now - this.lastSweep < this.windowMs) return;
    this.lastSweep = now;
    await this.db(TABLE).where('reset_at', '<=', new Date(now).toISOString()).delete();
  }
}

interface Row {
  hits: number | string;
  reset_at: string;
}
