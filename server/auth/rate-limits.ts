import type { Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { AppError } from '../http/app-error';

const FIFTEEN_MINUTES = 15 * 60 * 1000;

function limiter(limit: number, key: (req: Request) => string, skipSuccessfulRequests: boolean) {
  return rateLimit({
    windowMs: FIFTEEN_MINUTES,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests,
    keyGenerator: key,
    handler: (_req, _res, next) =>
      next(new AppError(429, 'rate_limited', 'Too many attempts. Wait a few minutes and try again.')),
  });
}

const emailOf = (req: Request) => String((req.body as { email?: unknown } | undefined)?.email ?? '').trim().toLowerCase();
const ipOf = (req: Request) => ipKeyGenerator(req.ip ?? 'unknown');

/** Failed sign-ins per address and e-mail; a successful one does not count. */
export const loginRateLimit = (limit: number) => limiter(limit, (req) => `${ipOf(req)}|${emailOf(req)}`, true);

/** Reset requests and reset attempts per address. */
export const resetRateLimit = (limit: number) => limiter(limit, (req) => ipOf(req), false);
