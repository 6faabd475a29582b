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

/**
 * A router whose every route must state its access rule and may state zod schemas for params,
 * query and body. Validation failures become 422 with field paths (see error-handler).
 */
export function apiRouter() {
  const router = Router();
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
      router[method](path, accessGuard(spec.access), ...(spec.before ?? []), run);
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
