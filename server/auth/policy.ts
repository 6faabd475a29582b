import type { Request, RequestHandler } from 'express';
import { can, type Action } from '../../shared/domain/policy';
import { AppError } from '../http/app-error';
import type { AuthUser } from './auth-user';

/** What a route needs: a policy action, only a signed-in user, or nothing (with the reason). */
export type Access = { action: Action } | { signedIn: true } | { public: string };

export const ACCESS = Symbol('ridgeload.access');
export type GuardedHandler = RequestHandler & { [ACCESS]: Access };

export function describeAccess(access: Access): string {
  if ('action' in access) return access.action;
  if ('signedIn' in access) return 'signed-in';
  return `public (${access.public})`;
}

/** The first handler of every API route: it states and enforces the route's access rule. */
export function accessGuard(access: Access): GuardedHandler {
  const guard: RequestHandler = (req, _res, next) => {
    if ('public' in access) return next();
    if (!req.user) return next(AppError.unauthenticated());
    if ('action' in access && !can(req.user.role, access.action)) return next(AppError.forbidden());
    next();
  };
  return Object.assign(guard, { [ACCESS]: access });
}

/** The signed-in user of a guarded route. */
export function currentUser(req: Request): AuthUser {
  if (!req.user) throw AppError.unauthenticated();
  return req.user;
}
