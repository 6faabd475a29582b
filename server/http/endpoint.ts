import { Router, type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import type { z } from 'zod';
import { accessGuard, type Access } from '../auth/policy';

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface EndpointSpec<P extends z.ZodType, Q extends z.ZodType, B extends z.ZodType> {
  access: Access;
  params?: P;
  query?: Q;
  body?: B;
  /** Middleware that runs after the access check and before validation (rate limits, uploads). */
  before?: RequestHandler[];
}

export interface Valid<P, Q, B> {
  params: P;
  query: Q;
  body: B;
}

type Out<S> = S extends z.ZodType ? z.output<S> : undefined;

export type EndpointHandler<P, Q, B> = (req: Request, res: Response, valid: Valid<P, Q, B>) => Promise<unknown> | unknown;

/** '/orders/:id' → 'orders'; '/branches/:id/stock' → 'branches'. Lower case, as Express matches paths regardless of case. */
const firstSegment = (path: string) => {
  const end = path.indexOf('/', 1);
  return path.slice(1, end === -1 ? undefined : end).toLowerCase();
};

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
  const router = Object.assign(
    (req: Request, res: Response, next: NextFunction) => {
      if (!segments.has(firstSegment(req.path))) {
        next();
        return;
      }
      inner(req, res, next);
    },
    { stack: inner.stack },
  );
  const add =
    (method: Method) =>
    <P extends z.ZodType = z.ZodType, Q extends z.ZodType = z.ZodType, B extends z.ZodType = z.ZodType>(
      path: string,
      spec: EndpointSpec<P, Q, B>,
      handler: EndpointHandler<Out<P>, Out<Q>, Out<B>>,
    ) => {
      const run = async (req: Request, res: Response, next: NextFunction) => {
        try {
          const valid = {
            params: spec.params ? spec.params.parse(req.params) : undefined,
            query: spec.query ? spec.query.parse(req.query) : undefined,
            body: spec.body ? spec.body.parse(req.body ?? {}) : undefined,
          } as Valid<Out<P>, Out<Q>, Out<B>>;
          await handler(req, res, valid);
        } catch (err) {
          next(err);
        }
      };
      if (path.startsWith('/:')) throw new Error(`${path}: an API route starts with a fixed segment`);
      segments.add(firstSegment(path));
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
