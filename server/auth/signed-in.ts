import type { Request, RequestHandler } from 'express';
import type { AuthUser } from './auth-user';

type PassportSession = { passport?: { user?: number | string } };

/**
 * Makes the person the session signs in the request's user (`req.user`), in place of passport's
 * session strategy. Usually that person was read in the same query as the session
 * (`req.signedIn`, session-store.ts); when the session was read another way (a transaction open on
 * SQLite) the person is read here. A session naming someone who is no longer there signs nobody in
 * and forgets them, as passport does. Sign-in and sign-out stay passport's (`req.logIn`, `req.logOut`).
 */
export function loadSignedIn(findUser: (id: number) => Promise<AuthUser | undefined>): RequestHandler {
  return (req, _res, next) => {
    const session = req.session as (typeof req.session & PassportSession) | undefined;
    const id = session?.passport?.user;
    if (id === undefined || id === null) {
      req.signedIn = undefined;
      return next();
    }
    const settle = (user: AuthUser | null | undefined) => {
      if (user) req.user = user;
      else delete session!.passport!.user;
      next();
    };
    const read = req.signedIn;
    if (read && read.id === Number(id)) return settle(read.user);
    req.signedIn = undefined;
    findUser(Number(id)).then(settle, next);
  };
}

/**
 * The order-book version of the signed-in person's organisation, read with this request's session
 * (so before anything of the order book is read), or undefined when it was not read that way.
 */
export function bookVersionReadWith(req: Request): number | undefined {
  const read = req.signedIn;
  return read && read.user && read.user === req.user ? read.bookVersion : undefined;
}
