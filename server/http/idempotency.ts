import { createHash } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import type { Db } from '../db/knex';
import { isoInHours, nowIso } from '../db/time';
import { AppError } from './app-error';

/** How long a first answer is kept for its retries. */
export const IDEMPOTENCY_HOURS = 24;
/** A first request still unanswered after this long is taken as lost (its server stopped), and a retry runs again. */
const ABANDONED_MS = 60_000;
const KEY = /^[\x21-\x7e]{8,200}$/;

export const IDEMPOTENCY_HEADER = 'Idempotency-Key';
export const REPLAYED_HEADER = 'Idempotent-Replayed';

interface KeyRow {
  request_hash: string;
  status: number | null;
  content_type: string | null;
  body: string | null;
  created_at: string;
}

/** What a request asks for: its body and any uploaded files, so a same key with other content is told apart. */
function requestHash(req: Request): string {
  const h = createHash('sha256');
  // A raw upload (a CSV sent as the body) is hashed as bytes; a parsed body as its JSON.
  h.update(Buffer.isBuffer(req.body) ? req.body : JSON.stringify(req.body ?? {}));
  const files = (req.files ?? []) as Express.Multer.File[] | Record<string, Express.Multer.File[]>;
  const list = [...(Array.isArray(files) ? files : Object.values(files).flat()), ...(req.file ? [req.file] : [])];
  for (const f of list) h.update(`\n${f.fieldname}:${createHash('sha256').update(f.buffer).digest('hex')}`);
  return h.digest('hex');
}

const isUniqueViolation = (err: unknown) => {
  const e = err as { code?: string; message?: string };
  return e.code === '23505' || /^SQLITE_CONSTRAINT/.test(e.code ?? '') || /unique|duplicate/i.test(e.message ?? '');
};

/**
 * One mechanism for every write a client may send twice (a phone's offline queue, a double click, a
 * lost answer): with an `Idempotency-Key` header, the first successful answer is kept for 24 hours
 * under (user, key, route), and a repeat gets that answer back without running again. A repeat
 * while the first is still running gets 409 `request_in_progress`; the same key with another body
 * gets 422 `idempotency_key_reused`. An answer that failed (4xx/5xx) changed nothing and is not kept,
 * so a retry after the cause is fixed runs again. Without the header a request runs as usual.
 *
 * Put it after any body parser or upload middleware (so the hash covers the files) and before the
 * handler: `before: [upload, idempotent]`.
 */
export function idempotency(db: Db): RequestHandler {
  return async (req, res, next) => {
    const key = req.get(IDEMPOTENCY_HEADER);
    if (key === undefined) return next();
    try {
      if (!KEY.test(key)) {
        throw AppError.badRequest('idempotency_key_invalid', `The ${IDEMPOTENCY_HEADER} header must be 8 to 200 printable characters without spaces`);
      }
      if (!req.user) throw AppError.unauthenticated();
      const id = { user_id: req.user.id, key, route: `${req.method} ${(req.baseUrl + req.path).replace(/\/+$/, '')}` };
      const hash = requestHash(req);
      const now = nowIso();
      // Answers past their 24 hours go, this key's and everyone's (an index on expires_at keeps it cheap).
      await db('idempotency_keys').where('expires_at', '<', now).delete();
      try {
        await db('idempotency_keys').insert({ ...id, request_hash: hash, status: null, content_type: null, body: null, created_at: now, expires_at: isoInHours(IDEMPOTENCY_HOURS) });
      } catch (err) {
        if (!isUniqueViolation(err)) throw err;
        const row = (await db('idempotency_keys').where(id).first()) as KeyRow | undefined;
        if (!row) throw AppError.conflict('request_in_progress', 'The same request is being answered; try again in a moment');
        if (row.request_hash !== hash) {
          throw AppError.unprocessable('idempotency_key_reused', `This ${IDEMPOTENCY_HEADER} was already used for a different request to ${id.route}; make a new key for a new request`);
        }
        if (row.status === null) {
          if (Date.now() - Date.parse(row.created_at) < ABANDONED_MS) throw AppError.conflict('request_in_progress', 'The same request is still being answered; try again in a moment');
          await db('idempotency_keys').where(id).update({ created_at: now });
        } else {
          res.status(row.status).set(REPLAYED_HEADER, 'true');
          if (row.content_type) res.type(row.content_type);
          res.send(row.body ?? '');
          return;
        }
      }
      keepAnswer(db, res, id);
      next();
    } catch (err) {
      next(err);
    }
  };
}

/**
 * Files the handler's answer under the key before it goes out, so a retry that arrives the moment
 * the first answer lands already finds it; a failed answer frees the key instead.
 */
function keepAnswer(db: Db, res: Response, id: { user_id: number; key: string; route: string }) {
  const send = res.send.bind(res);
  let filed = false;
  res.send = ((body?: unknown) => {
    if (filed) return send(body as never);
    filed = true;
    const text = Buffer.isBuffer(body) ? body.toString('utf8') : typeof body === 'string' ? body : body === undefined ? '' : JSON.stringify(body);
    const write =
      res.statusCode < 400
        ? db('idempotency_keys')
            .where(id)
            .update({ status: res.statusCode, content_type: String(res.getHeader('content-type') ?? 'application/json; charset=utf-8'), body: text })
        : db('idempotency_keys').where(id).whereNull('status').delete();
    write.then(
      () => send(body as never),
      () => send(body as never),
    );
    return res;
  }) as Response['send'];
  res.once('close', () => {
    if (!filed)
      db('idempotency_keys')
        .where(id)
        .whereNull('status')
        .delete()
        .catch(() => undefined);
  });
}
