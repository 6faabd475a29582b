import type { NextFunction, Request, Response } from 'express';

/**
 * True when the TCP peer of the request is this machine. Only the socket counts: a proxy header
 * (X-Forwarded-For) or Express's `req.ip` under `trust proxy` is written by whoever sends the
 * request, so it proves nothing about where the request came from.
 */
export function fromLoopback(req: Request): boolean {
  const address = req.socket.remoteAddress ?? '';
  return address === '::1' || /^(::ffff:)?127(\.\d{1,3}){3}$/.test(address);
}

/**
 * Lets a route answer only requests from this machine; anyone else gets the API's ordinary 404,
 * as if the route were not there.
 */
export function loopbackOnly(req: Request, _res: Response, next: NextFunction) {
  next(fromLoopback(req) ? undefined : 'route');
}
