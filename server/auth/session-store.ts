import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { Request } from 'express';
import type { Session, SessionData } from 'express-session';
import type { OrganisationKind, Role } from '../../shared/domain/roles';
import type { AuthUser, SignedInRead } from './auth-user';
import { dialectOf, jsonTextSql } from '../db/dialect';
import { peekRow, pgRow, type Db } from '../db/knex';

/** How often a server sweeps expired sessions out of the table, on its own writes. */
const SWEEP_EVERY_MS = 60_000;

const USER_COLUMNS = 'u.id as user_id, u.email, u.name, u.role, o.id as org_id, o.name as org_name, o.kind as org_kind, v.version as book_version';
/**
 * The session and the person it signs in, in one read (the user id sits in the session's JSON),
 * with their organisation's order-book version: the order book reads it first on every request,
 * and it may as well come with the session's row than in a query of its own.
 */
const SESSION_WITH_USER_SQL = {
  sqlite: `select s.sess, s.expired, json_extract(s.sess, '$.passport.user') as signed_in, ${USER_COLUMNS} from sessions s
    left join users u on u.id = json_extract(s.sess, '$.passport.user') left join organisations o on o.id = u.organisation_id
    left join order_book_versions v on v.organisation_id = u.organisation_id
    where s.sid = ? and datetime(?) <= datetime(s.expired)`,
  postgres: `select s.sess, s.expired, s.sess #>> '{passport,user}' as signed_in, ${USER_COLUMNS} from sessions s
    left join users u on u.id = case when (s.sess #>> '{passport,user}') ~ '^[0-9]{1,15}$' then (s.sess #>> '{passport,user}')::bigint end
    left join organisations o on o.id = u.organisation_id
    left join order_book_versions v on v.organisation_id = u.organisation_id
    where s.sid = $1 and cast($2 as timestamp with time zone) <= s.expired`,
};

interface SessionWithUserRow {
  sess: string | SessionData;
  expired: string | Date;
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

/** The read carried from the store's get() to createSession() on the same request (never stored: not enumerable). */
const READ_WITH_SESSION = Symbol('readWithSession');

/**
 * Sessions in the database, read from it on every request: no copy lives in one process, so a
 * sign-out, a reset or a removal made through any server is seen by every server at once.
 *
 * The read is the commonest query there is, so on SQLite it goes straight to the open connection
 * (peekRow: a prepared statement, no query building) whenever no transaction is open there. The
 * same query reads the person the session signs in, their organisation and its order-book version:
 * createSession() puts that read on the request as `req.signedIn`, and loadSignedIn (signed-in.ts)
 * makes it the request's user. One read per request on either database.
 *
 * The session's expiry is the one in the table (`expired`), put on the session's cookie when it is
 * read. express-session's touch on every response does nothing here: the expiry is moved by
 * rollingSession (session-cookie.ts) with moveExpiry(), at most once a minute per session, with
 * the cookie re-sent then.
 */
export class SessionStore extends ConnectSessionKnexStore {
  private lastSweep = 0;
  /** Makes a new session on the request (Store.regenerate() calls it); set by sessions() with the cookie's settings. */
  generate: (req: Express.Request) => void = () => {
    throw new Error('new sessions are made by the sessions() middleware');
  };

  constructor(private readonly db: Db) {
    // No timer of the store's own (it would outlive the app and its database): expired sessions are
    // swept by this server's own writes, at most once a minute (sweep()).
    super({ knex: db, tableName: 'sessions', createTable: true, cleanupInterval: 0 });
  }

  override async set(sid: string, session: SessionData, callback?: (err?: unknown) => void): Promise<void> {
    await super.set(sid, session, callback);
    await this.sweep();
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
        row = await pgRow<SessionWithUserRow>(this.db, 'ridgeload_session_with_user', SESSION_WITH_USER_SQL.postgres, sid, new Date().toISOString());
      } catch (err) {
        callback(err);
        throw err;
      }
    }
    const session = row ? withUser(row) : null;
    callback(null, session);
    return session;
  }

  /** express-session makes the request's session from what get() answered: what was read with it goes to the request. */
  override createSession(req: Request, data: SessionData): Session & SessionData {
    req.signedIn = (data as { [READ_WITH_SESSION]?: SignedInRead })[READ_WITH_SESSION];
    return super.createSession(req, data);
  }

  /** express-session touches every session it did not save; the expiry moves only through moveExpiry(). */
  override async touch(_sid: string, _session: SessionData, callback?: () => void): Promise<void> {
    callback?.();
  }

  /**
   * Moves a session's stored expiry. Only an update: a session signed out (deleted) meanwhile, on
   * this server or another, is never put back.
   */
  async moveExpiry(sid: string, expires: Date): Promise<void> {
    await super.touch(sid, { cookie: { expires } } as SessionData);
    await this.sweep();
  }

  /** Deletes sessions past their expiry (reads already ignore them), at most once every SWEEP_EVERY_MS per server. */
  private async sweep(): Promise<void> {
    const now = Date.now();
    if (now - this.lastSweep < SWEEP_EVERY_MS) return;
    this.lastSweep = now;
    const expired = dialectOf(this.db) === 'sqlite' ? 'datetime(expired) < datetime(?)' : 'expired < cast(? as timestamp with time zone)';
    try {
      await this.db('sessions')
        .whereRaw(expired, [new Date(now).toISOString()])
        .delete();
    } catch {
      // The write itself is done; expired rows are ignored by every read and swept a minute later.
    }
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
    if (ending.length > 0) await knex('sessions').whereIn('sid', ending).delete();
    return ending.length;
  }
}

/** The stored session with its expiry as the table holds it, carrying what was read with it under a symbol (never copied into the session, never saved). */
function withUser(row: SessionWithUserRow): SessionData {
  const session = (typeof row.sess === 'string' ? JSON.parse(row.sess) : row.sess) as SessionData & { [READ_WITH_SESSION]?: SignedInRead };
  const expired = new Date(row.expired);
  if (session.cookie && Number.isFinite(expired.getTime())) session.cookie.expires = expired;
  if (row.signed_in !== null && row.signed_in !== undefined) {
    const user: AuthUser | null = row.user_id === null ? null : { id: row.user_id, email: row.email, name: row.name, role: row.role, organisation: { id: row.org_id, name: row.org_name, kind: row.org_kind } };
    const read: SignedInRead = { id: Number(row.signed_in), user, bookVersion: Number(row.book_version ?? 0) };
    Object.defineProperty(session, READ_WITH_SESSION, { value: read, enumerable: false });
  }
  return session;
}
