import type { Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Db } from '../db/knex';
import { AppError } from '../http/app-error';
import { DbRateLimitStore } from './rate-limit-store';

const FIFTEEN_MINUTES = 15 * 60 * 1000;

/** A limit counted in the database, so every server on it counts the same tries. */
function limiter(db: Db, name: string, limit: number, key: (req: Request) => string, skipSuccessfulRequests: boolean) {
  return rateLimit({
    store: new DbRateLimitStore(db, name),
    windowMs: FIFTEEN_MINUTES,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests,
    keyGenerator: key,
    handler: (_req, _res, next) => next(new AppError(429, 'rate_limited', 'Too many attempts. Wait a few minutes and try again.')),
  });
}

const emailOf = (req: Request) =>
  String((req.body as { email?: unknown } | undefined)?.email ?? '')
    .trim()
    .toLowerCase();
const ipOf = (req: Request) => ipKeyGenerator(req.ip ?? 'unknown');

/** Failed sign-ins per address and e-mail; a successful one does not count. */
export const loginRateLimit = (db: Db, limit: number) => limiter(db, 'login', limit, (req) => `${ipOf(req)}|${emailOf(req)}`, true);

/** Reset requests and reset attempts per address. */
export const resetRateLimit = (db: Db, limit: number) => limiter(db, 'reset', limit, (req) => ipOf(req), false);
