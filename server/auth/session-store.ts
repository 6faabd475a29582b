import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { SessionData } from 'express-session';
import type { Db } from '../db/knex';

const TOUCH_EVERY_MS = 5 * 60_000;
const REMEMBERED_SIDS = 50_000;

/**
 * Sessions in the database. express-session touches the stored expiry on every response, which
 * would make every signed-in read a database write; with a 7-day rolling session, moving the expiry
 * at most every few minutes keeps the same behaviour for a fraction of the writes.
 */
export class SessionStore extends ConnectSessionKnexStore {
  private readonly lastTouch = new Map<string, number>();

  constructor(db: Db) {
    super({ knex: db, tableName: 'sessions', createTable: true });
  }

  override async touch(sid: string, session: SessionData, callback?: () => void): Promise<void> {
    const now = Date.now();
    const last = this.lastTouch.get(sid);
    if (last !== undefined && now - last < TOUCH_EVERY_MS) {
      callback?.();
      return;
    }
    if (this.lastTouch.size >= REMEMBERED_SIDS) this.lastTouch.clear();
    this.lastTouch.set(sid, now);
    return super.touch(sid, session, callback);
  }

  override async destroy(sid: string, callback?: (err?: unknown) => void): Promise<number> {
    this.lastTouch.delete(sid);
    return super.destroy(sid, callback);
  }
}
