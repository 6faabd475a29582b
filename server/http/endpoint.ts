import { Router, type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import { z } from 'zod';
import { accessGuard, type Access } from '../auth/policy';
import { AppError } from './app-error';
import { parsedQueryCache, rawQuery } from './query-cache';

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface EndpointSpec<P extends z.core.$ZodType, Q extends z.core.$ZodType, B extends z.core.$ZodType> {
  access: Access;
  params?: P;
  query?: Q;
  body?: B;
  /** Middleware that runs after the access check and before validation (rate limits, uploads). */
  before?: RequestHandler[];
  /**
   * Keep the parsed query per query text for the business day this gives (see query-cache.ts): for
   * a read asked for with the same few queries over and over (the order book).
   */
  cacheQueryFor?: () => string;
}

export interface Valid<P, Q, B> {
  params: P;
  query: Q;
  body: B;
}

type Out<S> = S extends z.core.$ZodType ? z.output<S> : undefined;

export type EndpointHandler<P, Q, B> = (req: Request, res: Response, valid: Valid<P, Q, B>) => Promise<unknown> | unknown;

/** Path parameters that carry text (invitation tokens); every other one names a record by its id. */
const TEXT_PARAMS = new Set(['token']);
/** A record id as people and the client write it: plain decimal digits, no sign, no leading zero, no 0x or 1e0. */
const PLAIN_ID = /^[1-9][0-9]{0,14}$/;
/** Positions (a pallet's place in a run's deck plan) count from 0. */
const PLAIN_INDEX = /^(0|[1-9][0-9]{0,5})$/;
const INDEX_PARAMS = new Set(['index']);
/** C0 control characters and DEL. */
const isControl = (code: number) => code < 0x20 || code === 0x7f;
/** Tab, line feed and carriage return: kept in body text (notes, addresses), never in a query. */
const isBreak = (code: number) => code === 0x09 || code === 0x0a || code === 0x0d;
/** Control characters no one types into a search or a query (NUL, escape, tab and newline too). */
const hasQueryControl = (s: string) => {
  for (let i = 0; i < s.length; i++) if (isControl(s.charCodeAt(i))) return true;
  return false;
};
/** In body text, tab and line breaks are kept; every other control character is refused. */
const hasBodyControl = (s: string) => {
  for (let i = 0; i < s.length; i++) {
    const code = s.charCodeAt(i);
    if (isControl(code) && !isBreak(code)) return true;
  }
  return false;
};
/** Keys that name an object's prototype: no body of the API has such a field. */
const PROTOTYPE_KEYS = new Set(['__proto__', 'constructor', 'prototype']);
/** Deeper than any body the API takes; a deeper one is refused before it is walked further. */
const MAX_BODY_DEPTH = 32;

function invalidField(path: string, message: string) {
  return AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path, message }]);
}

/**
 * Checks every request the same way before its own schemas run: a path id that is not a plain
 * decimal integer names no record (404, as a missing one does); query text with control characters,
 * a query `…_id` that is not a plain integer, body text with control characters, keys naming a
 * prototype and bodies nested deeper than any the API takes are refused with 422 naming the field.
 */
export function checkRequestShape(req: Request): void {
  checkParams(req);
  checkQuery(req.query);
  checkBody(req);
}

function checkParams(req: Request): void {
  for (const [name, value] of Object.entries(req.params ?? {})) {
    if (TEXT_PARAMS.has(name)) continue;
    const plain = INDEX_PARAMS.has(name) ? PLAIN_INDEX : PLAIN_ID;
    if (typeof value !== 'string' || !plain.test(value)) throw AppError.notFound();
  }
}

function checkQuery(query: unknown): void {
  for (const [name, raw] of Object.entries((query ?? {}) as Record<string, unknown>)) {
    for (const value of Array.isArray(raw) ? raw : [raw]) {
      if (typeof value !== 'string') continue;
      if (hasQueryControl(value)) throw invalidField(name, 'must not contain control characters');
      if (name.endsWith('_id') && value !== '' && !PLAIN_ID.test(value)) throw invalidField(name, 'must be a whole number id');
    }
  }
}

function checkBody(req: Request): void {
  if (req.body && typeof req.body === 'object' && !Buffer.isBuffer(req.body)) walkBody(req.body, [], 0);
}

function walkBody(value: unknown, path: (string | number)[], depth: number): void {
  if (typeof value === 'string') {
    if (hasBodyControl(value)) throw invalidField(path.join('.'), 'must not contain control characters');
    return;
  }
  if (typeof value !== 'object' || value === null) return;
  if (depth >= MAX_BODY_DEPTH) throw invalidField(path.join('.'), `is nested too deeply (at most ${MAX_BODY_DEPTH} levels)`);
  if (Array.isArray(value)) {
    value.forEach((v, i) => walkBody(v, [...path, i], depth + 1));
    return;
  }
  for (const [k, v] of Object.entries(value)) {
    if (hasBodyControl(k)) throw invalidField([...path, k].join('.'), 'must not contain control characters');
    if (PROTOTYPE_KEYS.has(k)) throw invalidField([...path, k].join('.'), 'is not a field of this request');
    walkBody(v, [...path, k], depth + 1);
  }
}

/** '/orders/:id' → 'orders'; '/branches/:id/stock' → 'branches'. Lower case, as Express matches paths regardless of case. */
const firstSegment = (path: string) => {
  const end = path.indexOf('/', 1);
  return path.slice(1, end === -1 ? undefined : end).toLowerCase();
};

/** A module's router as apiRouter() makes it: a gate on the first path segment of its routes. */
export type ModuleRouter = ((req: Request, res: Response, next: NextFunction) => void) & {
  stack: unknown[];
  segments: ReadonlySet<string>;
  /** 'GET orders', 'POST orders': the methods its routes answer under each first segment. */
  methodSegments: ReadonlySet<string>;
};

/** Methods an apiRouter's routes are declared with; Express answers HEAD with a GET route. Others (OPTIONS) reach every module under the segment. */
const ROUTE_METHODS = new Set(['GET', 'POST', 'PUT', 'PATCH', 'DELETE']);
const routeMethod = (method: string) => (method === 'HEAD' ? 'GET' : ROUTE_METHODS.has(method) ? method : undefined);

/**
 * The API's modules behind one gate: a request goes straight to the modules with a route under its
 * first path segment, in the order given (as if each were mounted in turn), instead of passing
 * every other module's gate on the way. Keeps each module's router in its stack for the route
 * inventory.
 */
export function apiModules(routers: ModuleRouter[]): RequestHandler & { stack: { handle: ModuleRouter }[] } {
  const bySegment = new Map<string, ModuleRouter[]>();
  for (const r of routers) for (const segment of r.segments) bySegment.set(segment, [...(bySegment.get(segment) ?? []), r]);
  // By method too: a GET for /orders passes no module whose only route there is a POST.
  const byMethod = new Map<string, ModuleRouter[]>();
  for (const r of routers) for (const key of r.methodSegments) byMethod.set(key, [...(byMethod.get(key) ?? []), r]);
  const handler: RequestHandler = (req, res, next) => {
    const segment = firstSegment(req.path);
    const method = routeMethod(req.method);
    const modules = method ? byMethod.get(`${method} ${segment}`) : bySegment.get(segment);
    if (!modules) return next();
    let i = 0;
    const step = (err?: unknown) => {
      // 'router' leaves one module's router: the next module is tried, as when each is mounted on its own.
      if (err && err !== 'router') return next(err);
      if (i === modules.length) return next();
      modules[i++](req, res, step);
    };
    step();
  };
  return Object.assign(handler, { stack: routers.map((handle) => ({ handle })) });
}

/**
 * A router whose every route must state its access rule and may state zod schemas for params,
 * query and body. Validation failures become 422 with field paths (see error-handler).
 *
 * The API mounts some twenty of these side by side; a request for /orders would otherwise be
 * matched against every route of every module before it. `router` is a gate that passes a request
 * to the module only when one of its routes starts with the request's first path segment (it keeps
 * the module's route stack, so the route inventory still sees every route).
 */
export function apiRouter() {
  const inner = Router();
  const segments = new Set<string>();
  const methodSegments = new Set<string>();
  const router: ModuleRouter = Object.assign(
    (req: Request, res: Response, next: NextFunction) => {
      if (!segments.has(firstSegment(req.path))) {
        next();
        return;
      }
      inner(req, res, next);
    },
    { stack: inner.stack, segments, methodSegments },
  );
  const add =
    (method: Method) =>
    <P extends z.core.$ZodType = z.core.$ZodType, Q extends z.core.$ZodType = z.core.$ZodType, B extends z.core.$ZodType = z.core.$ZodType>(
      path: string,
      spec: EndpointSpec<P, Q, B>,
      handler: EndpointHandler<Out<P>, Out<Q>, Out<B>>,
    ) => {
      const queries = spec.query && spec.cacheQueryFor ? parsedQueryCache<unknown>(spec.cacheQueryFor) : undefined;
      const run = async (req: Request, res: Response, next: NextFunction) => {
        try {
          // A query text that passed today is not checked or parsed again (Express parses req.query anew on every read).
          const raw = queries ? rawQuery(req.url) : '';
          const kept = queries?.get(raw);
          const query = kept === undefined ? req.query : undefined;
          checkParams(req);
          if (kept === undefined) checkQuery(query);
          checkBody(req);
          const valid = {
            params: spec.params ? z.parse(spec.params, req.params) : undefined,
            query: kept ?? (spec.query ? z.parse(spec.query, query) : undefined),
            body: spec.body ? z.parse(spec.body, req.body ?? {}) : undefined,
          } as Valid<Out<P>, Out<Q>, Out<B>>;
          if (queries && kept === undefined) queries.set(raw, valid.query);
          await handler(req, res, valid);
        } catch (err) {
          next(err);
        }
      };
      if (path.startsWith('/:')) throw new Error(`${path}: an API route starts with a fixed segment`);
      segments.add(firstSegment(path));
      methodSegments.add(`${method.toUpperCase()} ${firstSegment(path)}`);
      inner[method](path, accessGuard(spec.access), ...(spec.before ?? []), run);
    };
  return {
    router,
    get: add('get'),
    post: add('post'),
    put: add('put'),
    patch: add('patch'),
    delete: add('delete'),
  };
}
