import type { RequestHandler } from 'express';
import type { SessionStore } from './session-store';

/** The session cookie's name. */
export const SESSION_COOKIE = 'ridgeload.sid';
/** A session's expiry (in the table and in the browser) moves at most this often. */
export const ROLL_EVERY_MS = 60_000;

interface RollingOptions {
  /** How long a session lasts after it was last used. */
  maxAgeMs: number;
  /** express-session's signed value of a session id (the same one its own cookie carries). */
  sign: (sid: string) => string;
  cookie: { httpOnly: boolean; sameSite: 'lax' | 'strict'; secure: boolean };
}

/**
 * A rolling session without re-sending the cookie on every answer: when the session's stored
 * expiry is a minute or more behind where use would put it (now + maxAgeMs), the expiry moves in
 * the table (an update only: a session signed out meanwhile anywhere stays out) and the cookie
 * goes out again with the new expiry; otherwise the answer carries no cookie. express-session runs
 * with `rolling: false` and still sends the cookie itself for a new or regenerated session.
 *
 * The stored expiry is the one the session's read found in the table (session-store.ts), so every
 * server makes the same choice for a session, whichever of them moved it last.
 */
export function rollingSession(store: Pick<SessionStore, 'moveExpiry'>, options: RollingOptions): RequestHandler {
  return (req, res, next) => {
    const session = req.session;
    const stored = session?.cookie.expires;
    const now = Date.now();
    // A new session carries now + maxAge; one read from the table carries its stored expiry.
    if (!session || !(stored instanceof Date) || now + options.maxAgeMs - stored.getTime() < ROLL_EVERY_MS) return next();
    // A Secure cookie is only ever handed out over https (as express-session does).
    if (options.cookie.secure && !req.secure) return next();
    const sid = req.sessionID;
    const expires = new Date(now + options.maxAgeMs);
    store.moveExpiry(sid, expires).then(() => {
      session.cookie.expires = expires;
      const writeHead = res.writeHead;
      res.writeHead = function (this: typeof res, ...args: Parameters<typeof res.writeHead>) {
        // Not for a session signed out or replaced (sign-in, sign-out) on this request: express-session sends that one.
        if (req.sessionID === sid && req.session) res.cookie(SESSION_COOKIE, options.sign(sid), { ...options.cookie, path: '/', expires });
        return writeHead.apply(this, args);
      } as typeof res.writeHead;
      next();
    }, next);
  };
}
