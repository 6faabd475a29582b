import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { Request } from 'express';
import type { Session, SessionData } from 'express-session';
import { LRUCache } from 'lru-cache';
import type { OrganisationKind, Role } from '../../shared/domain/roles';
import type { AuthUser } from './auth-user';
import { dialectOf, jsonTextSql } from '../db/dialect';
import { peekRow, type Db } from '../db/knex';

const TOUCH_EVERY_MS = 5 * 60_000;
const WRITTEN_AT_ENTRIES = 10_000;
const STORED_EXPIRY_MARGIN_MS = 60 * 60_000;

const USER_COLUMNS = 'u.id as user_id, u.email, u.name, u.role, o.id as org_id, o.name as org_name, o.kind as org_kind, v.version as book_version';
/**
 * The session and the person it signs in, in one read (the user id sits in the session's JSON),
 * with their organisation's order-book version: the order book reads it first on every request,
 * and it may as well come with the session's row than in a query of its own.
 */
const SESSION_WITH_USER_SQL = {
  sqlite: `select s.sess, json_extract(s.sess, '$.passport.user') as signed_in, ${USER_COLUMNS} from sessions s
    left join users u on u.id = json_extract(s.sess, '$.passport.user') left join organisations o on o.id = u.organisation_id
    left join order_book_versions v on v.organisation_id = u.organisation_id
    where s.sid = ? and datetime(?) <= datetime(s.expired)`,
  postgres: `select s.sess, s.sess #>> '{passport,user}' as signed_in, ${USER_COLUMNS} from sessions s
    left join users u on u.id = case when (s.sess #>> '{passport,user}') ~ '^[0-9]{1,15}$' then (s.sess #>> '{passport,user}')::bigint end
    left join organisations o on o.id = u.organisation_id
    left join order_book_versions v on v.organisation_id = u.organisation_id
    where s.sid = ? and cast(? as timestamp with time zone) <= s.expired`,
};

interface SessionWithUserRow {
  sess: string | SessionData;
  signed_in: number | string | null;
  user_id: number | null;
  email: string;
  name: string;
  role: Role;
  org_id: number;
  org_name: string;
  org_kind: OrganisationKind;
  book_version: number | string | null;
}

/** The user read with a session, carried from the store's read to passport's on the same request. */
const USER_READ_WITH_SESSION = Symbol('userReadWithSession');
type UserReadWithSession = { id: number; user: AuthUser | null };
const usersReadWithSessions = new WeakMap<Request, UserReadWithSession>();

/** Each request's person (a new object per read) to their organisation's order-book version, read at the same moment. */
const bookVersionsReadWithUsers = new WeakMap<AuthUser, number>();

/**
 * The order-book version of the person's organisation, read in the same query as the session on
 * this request (so before anything of the order book is read), or undefined when it was not.
 */
export function bookVersionReadWith(user: AuthUser): number | undefined {
  return bookVersionsReadWithUsers.get(user);
}

/**
 * The signed-in person as read in the same query as this request's session, or undefined when it
 * was not read that way (then the caller reads it itself). Null: the session names someone who is
 * no longer there.
 */
export function userReadWithSession(req: Request, id: number): AuthUser | null | undefined {
  const read = usersReadWithSessions.get(req);
  return read !== undefined && read.id === Number(id) ? read.user : undefined;
}

/**
 * Sessions in the database, read from it on every request: no copy lives in one process, so a
 * sign-out, a reset or a removal made through any server is seen by every server at once.
 *
 * The read is the commonest query there is, so on SQLite it goes straight to the open connection
 * (peekRow: a prepared statement, no query building) whenever no transaction is open there. The
 * same query reads the person the session signs in and their organisation, which passport would
 * otherwise read again (see userReadWithSession): one read per request on either database.
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
    const dialect = dialectOf(this.db);
    let row: SessionWithUserRow | undefined;
    if (dialect === 'sqlite') {
      let peek: { row: SessionWithUserRow | undefined } | null;
      try {
        peek = peekRow<SessionWithUserRow>(this.db, SESSION_WITH_USER_SQL.sqlite, sid, new Date().toISOString());
      } catch {
        peek = null; // the table is not there yet: let the store's own read wait for it
      }
      if (!peek) return (await super.get(sid, callback)) as SessionData | null;
      row = peek.row;
    } else {
      try {
        await this.ready;
        const result = (await this.db.raw(SESSION_WITH_USER_SQL.postgres, [sid, new Date().toISOString()])) as { rows: SessionWithUserRow[] };
        row = result.rows[0];
      } catch (err) {
        callback(err);
        throw err;
      }
    }
    const session = row ? withUser(row) : null;
    callback(null, session);
    return session;
  }

  /** express-session makes the request's session from what get() answered: the user read with it goes to the request. */
  override createSession(req: Request, data: SessionData): Session & SessionData {
    const read = (data as { [USER_READ_WITH_SESSION]?: UserReadWithSession })[USER_READ_WITH_SESSION];
    if (read) usersReadWithSessions.set(req, read);
    else usersReadWithSessions.delete(req);
    return super.createSession(req, data);
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

/** The stored session, carrying the user read with it under a symbol (never copied into the session, never saved). */
function withUser(row: SessionWithUserRow): SessionData {
  const session = (typeof row.sess === 'string' ? JSON.parse(row.sess) : row.sess) as SessionData & { [USER_READ_WITH_SESSION]?: UserReadWithSession };
  if (row.signed_in !== null && row.signed_in !== undefined) {
    const user: AuthUser | null = row.user_id === null ? null : { id: row.user_id, email: row.email, name: row.name, role: row.role, organisation: { id: row.org_id, name: row.org_name, kind: row.org_kind } };
    if (user) bookVersionsReadWithUsers.set(user, Number(row.book_version ?? 0));
    Object.defineProperty(session, USER_READ_WITH_SESSION, { value: { id: Number(row.signed_in), user }, enumerable: false });
  }
  return session;
}
