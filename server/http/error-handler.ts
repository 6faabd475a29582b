import { isUniqueViolation } from '../db/dialect';
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ErrorBody } from '../../shared/schemas/error.schema';
import { AppError } from './app-error';

export function zodDetails(err: ZodError) {
  return err.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }));
}

/** Unknown routes under /api answer in the API's own error shape. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError(404, 'route_not_found', `No API route ${req.method} ${req.originalUrl.split('?')[0]}`));
};

/** The central error handler: every error leaves as {error:{code,message,details?}}, never a stack. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const { status, body, log, retryAfter } = toErrorResponse(err);
  if (log) req.log?.error({ err, req: { id: req.id, method: req.method, url: req.originalUrl } }, 'unhandled error');
  if (res.headersSent) return;
  if (retryAfter) res.setHeader('Retry-After', String(retryAfter));
  res.status(status).json(body);
};

function toErrorResponse(err: unknown): { status: number; body: ErrorBody; log: boolean; retryAfter?: number } {
  if (err instanceof AppError) {
    return {
      status: err.status,
      body: { error: { code: err.code, message: err.message, ...(err.details ? { details: err.details } : {}) } },
      log: !err.operational,
    };
  }
  if (err instanceof ZodError) {
    return {
      status: 422,
      body: { error: { code: 'validation_failed', message: 'Some fields are not valid', details: zodDetails(err) } },
      log: false,
    };
  }
  const e = err as { type?: string; status?: number; code?: string } | undefined;
  if (e?.type === 'entity.parse.failed') {
    return { status: 400, body: { error: { code: 'malformed_json', message: 'The request body is not valid JSON' } }, log: false };
  }
  if (e?.type === 'entity.too.large' || e?.code === 'LIMIT_FILE_SIZE') {
    return { status: 413, body: { error: { code: 'payload_too_large', message: 'The request body is too large' } }, log: false };
  }
  if (e?.type === 'encoding.unsupported' || e?.type === 'charset.unsupported') {
    return { status: 415, body: { error: { code: 'unsupported_encoding', message: 'The request body encoding is not supported' } }, log: false };
  }
  if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500) {
    return { status: e.status, body: { error: { code: 'bad_request', message: 'The request could not be read' } }, log: false };
  }
  // The database is overloaded or gave a transaction up for another's sake: nothing was written,
  // and the same request a moment later succeeds. SQLite waited its busy timeout for the write lock;
  // PostgreSQL ended a transaction as a deadlock or serialization victim after its retries
  // (server/db/knex.ts) or waited too long for a lock; or no connection came free in time.
  if (e?.code === 'SQLITE_BUSY' || e?.code === '40001' || e?.code === '40P01' || e?.code === '55P03' || (err as Error | undefined)?.name === 'KnexTimeoutError') {
    return { status: 503, body: { error: { code: 'busy', message: 'The server is busy; try again in a moment' } }, log: true, retryAfter: 1 };
  }
  // A race the use case's own check did not catch: the database's unique rule kept it out.
  if (isUniqueViolation(err)) return { status: 409, body: { error: { code: 'conflict', message: 'Someone else has just made the same change; reload to see it' } }, log: true };
  return { status: 500, body: { error: { code: 'internal', message: 'Something went wrong on our side' } }, log: true };
}
