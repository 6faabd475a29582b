import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler, Response } from 'express';
import expressSession, { type Cookie, type Session } from 'express-session';
import type { SessionStore } from './session-store';

/** The session cookie's name. */
export const SESSION_COOKIE = 'ridgeload.sid';
/** A session's expiry (in the table and in the browser) moves at most this often. */
export const ROLL_EVERY_MS = 60_000;

export interface SessionOptions {
  secret: string;
  /** How long a session lasts after it was last used (a rolling expiry). */
  maxAgeMs: number;
  cookie: { httpOnly: boolean; sameSite: 'lax' | 'strict'; secure: boolean };
}

/** 's:' + id + '.' + HMAC-SHA256 of the id (base64, no padding): the value express-session signs and reads. */
export function signSessionId(sid: string, secret: string): string {
  return `s:${sid}.${mac(sid, secret)}`;
}

const mac = (sid: string, secret: string) => createHmac('sha256', secret).update(sid).digest('base64').replace(/=+$/, '');

/** The session id from a Cookie header, when it carries the session cookie with a valid signature: one HMAC, compared in constant time. */
export function sessionIdFromCookie(header: string | undefined, secret: string): string | undefined {
  if (!header) return undefined;
  let at = header.indexOf(`${SESSION_COOKIE}=`);
  while (at > 0 && header[at - 1] !== ' ' && header[at - 1] !== ';') at = header.indexOf(`${SESSION_COOKIE}=`, at + 1);
  if (at < 0) return undefined;
  const start = at + SESSION_COOKIE.length + 1;
  const end = header.indexOf(';', start);
  let value = header.slice(start, end < 0 ? undefined : end).trim();
  if (value.startsWith('"') && value.endsWith('"')) value = value.slice(1, -1);
  try {
    if (value.includes('%')) value = decodeURIComponent(value);
  } catch {
    return undefined;
  }
  if (!value.startsWith('s:')) return undefined;
  const dot = value.lastIndexOf('.');
  if (dot < 2) return undefined;
  const sid = value.slice(2, dot);
  const sent = Buffer.from(value.slice(dot + 1));
  const expected = Buffer.from(mac(sid, secret));
  return sent.length === expected.length && timingSafeEqual(sent, expected) ? sid : undefined;
}

/** express-session's own classes; its published types hide their constructors. */
const classes = expressSession as unknown as { Session: new (req: Express.Request, data?: object) => Session; Cookie: new (options: object) => Cookie };

/** The session's data as text, without its cookie: what tells whether the request changed it. */
function dataOf(session: Session): string {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  const { cookie, ...data } = session;
  return JSON.stringify(data);
}

/**
 * Sessions in the database behind an HttpOnly, signed cookie: express-session's Session, Cookie and
 * Store (so passport's req.logIn / req.logOut regenerate and save them as before), with a
 * request-time part of our own that does per request only what a request needs:
 *
 * - the cookie's signature is checked once (one HMAC, compared in constant time), from the Cookie
 *   header without parsing every cookie in it;
 * - the session (with the person it signs in, session-store.ts) is read once;
 * - the session is written at the end of a request that changed it (its data compared as text
 *   with what was read); a new session is stored, and goes out as a cookie, only once something
 *   is put in it (nothing for a visitor who never needed one); passport's sign-in saves the
 *   session itself, and the end writes it once more (sign-ins are rare);
 * - the expiry rolls: when the stored expiry is a minute or more behind where use would put it, it
 *   moves in the table (an update only: a session signed out meanwhile on any server stays out) and
 *   the cookie goes out again with it; otherwise an answer carries no cookie.
 *
 * Every server decides from what the table holds, so sign-out, resets and removals made through
 * any of them count at the next request everywhere.
 */
export function sessions(store: SessionStore, options: SessionOptions): RequestHandler {
  const cookieOptions = { ...options.cookie, path: '/', maxAge: options.maxAgeMs };
  const setCookie = (res: Response, sid: string, expires: Date) => res.cookie(SESSION_COOKIE, signSessionId(sid, options.secret), { ...options.cookie, path: '/', expires });
  // Session.regenerate() (passport's sign-in and sign-out) asks the store for a new session.
  store.generate = (req: Express.Request) => {
    req.sessionID = randomBytes(24).toString('base64url');
    req.session = new classes.Session(req);
    req.session.cookie = new classes.Cookie(cookieOptions);
  };

  return (req, res, next) => {
    req.sessionStore = store;
    const cookieSid = sessionIdFromCookie(req.headers.cookie, options.secret);
    let loadedId: string | undefined;
    let loadedData = '';
    /** The session as last written by this request (its id and data), if it was. */
    let saved: { id: string; data: string } | undefined;
    let rolled: Date | undefined;

    const changed = () => {
      const s = req.session;
      if (!s) return false;
      const data = dataOf(s);
      if (saved) return saved.id !== req.sessionID || saved.data !== data;
      // A session not stored before is written only once something is put in it.
      return loadedId === undefined || req.sessionID !== loadedId ? data !== '{}' : data !== loadedData;
    };
    const save = () =>
      new Promise<void>((resolve, reject) => {
        const s = req.session!;
        const data = dataOf(s);
        store.set(req.sessionID, s, (err) => (err ? reject(err) : resolve()));
        saved = { id: req.sessionID, data };
      });
    const mayCarryCookie = () => !options.cookie.secure || req.secure;

    const writeHead = res.writeHead;
    res.writeHead = function (this: Response, ...args: Parameters<Response['writeHead']>) {
      const s = req.session;
      if (s && mayCarryCookie()) {
        if (req.sessionID !== cookieSid && (saved?.id === req.sessionID || changed())) setCookie(res, req.sessionID, s.cookie.expires ?? new Date(Date.now() + options.maxAgeMs));
        else if (rolled && req.sessionID === loadedId) setCookie(res, req.sessionID, rolled);
      }
      return writeHead.apply(this, args);
    } as Response['writeHead'];

    const end = res.end;
    let ending = false;
    res.end = function (this: Response, ...args: unknown[]) {
      if (ending || !req.session || !changed()) return (end as (...a: unknown[]) => Response).apply(this, args);
      ending = true;
      save().then(
        () => (end as (...a: unknown[]) => Response).apply(this, args),
        (err: unknown) => {
          req.log?.error({ err }, 'the session could not be saved');
          (end as (...a: unknown[]) => Response).apply(this, args);
        },
      );
      return this;
    } as Response['end'];

    if (!cookieSid) {
      store.generate(req);
      return next();
    }
    req.sessionID = cookieSid;
    store.get(cookieSid, (err, data) => {
      if (err) return next(err);
      if (!data) store.generate(req);
      else {
        store.createSession(req, data);
        loadedId = cookieSid;
        loadedData = dataOf(req.session!);
      }
      const stored = data ? req.session!.cookie.expires : undefined;
      const now = Date.now();
      if (!(stored instanceof Date) || now + options.maxAgeMs - stored.getTime() < ROLL_EVERY_MS || !mayCarryCookie()) return next();
      const expires = new Date(now + options.maxAgeMs);
      store.moveExpiry(cookieSid, expires).then(() => {
        req.session!.cookie.expires = expires;
        rolled = expires;
        next();
      }, next);
    });
  };
}
