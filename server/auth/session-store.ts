import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { SessionData } from 'express-session';
import { LRUCache } from 'lru-cache';
import { dialectOf, jsonTextSql } from '../db/dialect';
import type { Db } from '../db/knex';

const TOUCH_EVERY_MS = 5 * 60_000;
const REMEMBERED_SESSIONS = 10_000;

interface Remembered {
  json: string;
  expires: number;
  touchedAt: number;
}

/**
 * Sessions in the database, with the ones in use remembered in memory.
 *
 * Every signed-in request reads its session; this process is the only one that writes the sessions
 * table (one SQLite file, one server), so a write-through copy in memory answers those reads without
 * a query and stays exact: set, touch and destroy go to the database and to the copy together. The
 * copy is kept as JSON text so no request can change another's session object.
 *
 * express-session also touches the stored expiry on every response, which would make every
 * signed-in read a database write; with a 7-day rolling session, moving the stored expiry at most
 * every few minutes keeps the same behaviour for a fraction of the writes (the copy's expiry moves
 * every time).
 */
export class SessionStore extends ConnectSessionKnexStore {
  private readonly remembered = new LRUCache<string, Remembered>({ max: REMEMBERED_SESSIONS });
  /**
   * Moves on every set and destroy of a session id, so a database read that began before them
   * (another request of the same session, at sign-out) cannot put the old session back in memory.
   */
  private readonly generations = new LRUCache<string, number>({ max: REMEMBERED_SESSIONS * 2 });

  private bump(sid: string) {
    this.generations.set(sid, (this.generations.get(sid) ?? 0) + 1);
  }

  constructor(db: Db) {
    super({ knex: db, tableName: 'sessions', createTable: true });
  }

  override async get(sid: string, callback: (err: unknown, session?: SessionData | null) => void): Promise<SessionData | null> {
    const copy = this.remembered.get(sid);
    if (copy) {
      if (copy.expires > Date.now()) {
        const session = JSON.parse(copy.json) as SessionData;
        callback(null, session);
        return session;
      }
      this.remembered.delete(sid);
    }
    const generation = this.generations.get(sid) ?? 0;
    const session = (await super.get(sid, callback)) as SessionData | null;
    if (session && (this.generations.get(sid) ?? 0) === generation) this.remember(sid, session, 0);
    return session;
  }

  override async set(sid: string, session: SessionData, callback?: (err?: unknown) => void): Promise<void> {
    this.remembered.delete(sid);
    this.bump(sid);
    await super.set(sid, session, callback);
    this.remember(sid, session, Date.now());
  }

  override async touch(sid: string, session: SessionData, callback?: () => void): Promise<void> {
    const now = Date.now();
    const copy = this.remembered.get(sid);
    if (copy && now - copy.touchedAt < TOUCH_EVERY_MS) {
      copy.expires = expiryOf(session, copy.expires);
      callback?.();
      return;
    }
    await super.touch(sid, session, callback);
    if (copy) {
      copy.expires = expiryOf(session, copy.expires);
      copy.touchedAt = now;
    }
  }

  override async destroy(sid: string, callback?: (err?: unknown) => void): Promise<number> {
    this.remembered.delete(sid);
    this.bump(sid);
    return super.destroy(sid, callback);
  }

  /**
   * Ends every session of one person (after a password reset: whoever held the old password is
   * signed out everywhere). Sessions carry the user id inside their JSON, so the ids are found there,
   * forgotten in memory and removed from the database.
   */
  async endAllFor(userId: number, except?: string): Promise<number> {
    const knex = this.options.knex as Db;
    const sids = (await knex('sessions')
      .whereRaw(`${jsonTextSql(knex, ['passport', 'user'])} = ?`, ['sess', dialectOf(knex) === 'postgres' ? String(userId) : userId])
      .pluck('sid')) as string[];
    for (const [sid, copy] of this.remembered.entries()) {
      if ((JSON.parse(copy.json) as { passport?: { user?: number } }).passport?.user === userId && !sids.includes(sid)) sids.push(sid);
    }
    const ending = sids.filter((sid) => sid !== except);
    for (const sid of ending) {
      this.remembered.delete(sid);
      this.bump(sid);
    }
    if (ending.length > 0) await knex('sessions').whereIn('sid', ending).delete();
    return ending.length;
  }

  override async clear(callback?: (err?: unknown) => void): Promise<number> {
    this.remembered.clear();
    return super.clear(callback);
  }

  private remember(sid: string, session: SessionData, touchedAt: number) {
    this.remembered.set(sid, { json: JSON.stringify(session), expires: expiryOf(session, Date.now()), touchedAt });
  }
}

/** The cookie's expiry as the session carries it (a Date, or ISO text once read back from JSON). */
function expiryOf(session: SessionData, fallback: number): number {
  const e = session.cookie?.expires as Date | string | null | undefined;
  const t = e ? new Date(e).getTime() : NaN;
  return Number.isFinite(t) ? t : fallback + 86_400_000;
}
