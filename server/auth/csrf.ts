import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { AppError } from '../http/app-error';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Synchroniser-token CSRF: the token lives in the session and must come back as X-CSRF-Token. */
export function issueCsrfToken(req: Request): string {
  if (!req.session.csrfToken) req.session.csrfToken = randomBytes(32).toString('base64url');
  return req.session.csrfToken;
}

export const csrfProtection: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method)) return next();
  const expected = req.session?.csrfToken;
  const sent = req.get('x-csrf-token');
  if (!expected || !sent || !sameToken(expected, sent)) {
    return next(new AppError(403, 'csrf_invalid', 'The form has expired; reload the page and try again'));
  }
  next();
};

function sameToken(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}
