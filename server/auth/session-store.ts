import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { SessionData } from 'express-session';
import { LRUCache } from 'lru-cache';
import { dialectOf, jsonTextSql } from '../db/dialect';
import { peekRow, type Db } from '../db/knex';

const TOUCH_EVERY_MS = 5 * 60_000;
const WRITTEN_AT_ENTRIES = 10_000;
const STORED_EXPIRY_MARGIN_MS = 60 * 60_000;

/**
 * Sessions in the database, read from it on every request: no copy lives in one process, so a
 * sign-out, a reset or a removal made through any server is seen by every server at once.
 *
 * The read is the commonest query there is, so on SQLite it goes straight to the open connection
 * (peekRow: a prepared statement, no query building) whenever no transaction is open there.
 *
 * express-session also touches the stored expiry on every response, which would make every
 * signed-in read a database write; with a 7-day rolling session, moving the stored expiry at most
 * every few minutes keeps the same behaviour for a fraction of the writes. The note of when each
 * session was last written is only a way to skip writes: a server that has none writes.
 */
export class SessionStore extends ConnectSessionKnexStore {
  /** When this server last wrote each session, and the expiry it wrote then. */
  private readonly writtenAt = new LRUCache<string, { at: number; expires: number }>({ max: WRITTEN_AT_ENTRIES });

  constructor(private readonly db: Db) {
    super({ knex: db, tableName: 'sessions', createTable: true });
  }

  override async get(sid: string, callback: (err: unknown, session?: SessionData | null) => void): Promise<SessionData | null> {
    if (dialectOf(this.db) === 'sqlite') {
      let peek: { row: { sess: string } | undefined } | null;
      try {
        peek = peekRow<{ sess: string }>(this.db, 'select sess from sessions where sid = ? and datetime(?) <= datetime(expired)', sid, new Date().toISOString());
      } catch {
        peek = null; // the table is not there yet: let the store's own read wait for it
      }
      if (peek) {
        const session = peek.row ? (JSON.parse(peek.row.sess) as SessionData) : null;
        callback(null, session);
        return session;
      }
    }
    return (await super.get(sid, callback)) as SessionData | null;
  }

  override async set(sid: string, session: SessionData, callback?: (err?: unknown) => void): Promise<void> {
    await super.set(sid, session, callback);
    this.writtenAt.set(sid, { at: Date.now(), expires: expiryOf(session) });
  }

  override async touch(sid: string, session: SessionData, callback?: () => void): Promise<void> {
    const now = Date.now();
    const last = this.writtenAt.get(sid);
    // Skip the write while the stored expiry is recent and still far off (a rolling 7-day session).
    if (last !== undefined && now - last.at < TOUCH_EVERY_MS && last.expires - now > STORED_EXPIRY_MARGIN_MS) {
      callback?.();
      return;
    }
    await super.touch(sid, session, callback);
    this.writtenAt.set(sid, { at: now, expires: expiryOf(session) });
  }

  override async destroy(sid: string, callback?: (err?: unknown) => void): Promise<number> {
    this.writtenAt.delete(sid);
    return super.destroy(sid, callback);
  }

  /**
   * Ends every session of one person (after a password reset: whoever held the old password is
   * signed out everywhere). Sessions carry the user id inside their JSON, so the ids are found there
   * and removed from the database.
   */
  async endAllFor(userId: number, except?: string): Promise<number> {
    const knex = this.db;
    const sids = (await knex('sessions')
      .whereRaw(`${jsonTextSql(knex, ['passport', 'user'])} = ?`, ['sess', dialectOf(knex) === 'postgres' ? String(userId) : userId])
      .pluck('sid')) as string[];
    const ending = sids.filter((sid) => sid !== except);
    for (const sid of ending) this.writtenAt.delete(sid);
    if (ending.length > 0) await knex('sessions').whereIn('sid', ending).delete();
    return ending.length;
  }

  override async clear(callback?: (err?: unknown) => void): Promise<number> {
    this.writtenAt.clear();
    return super.clear(callback);
  }
}

/** The cookie's expiry as the session carries it (a Date, or ISO text once read back from JSON). */
function expiryOf(session: SessionData): number {
  const e = session.cookie?.expires as Date | string | null | undefined;
  const t = e ? new Date(e).getTime() : NaN;
  return Number.isFinite(t) ? t : Date.now() + 86_400_000;
}
