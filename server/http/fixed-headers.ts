import type { IncomingMessage, ServerResponse } from 'node:http';
import type { RequestHandler } from 'express';

type NodeMiddleware = (req: IncomingMessage, res: ServerResponse, next: (err?: unknown) => void) => void;

/**
 * The headers a middleware sets on every answer whatever the request (helmet's, configured with
 * no per-request values such as nonces), worked out once at start-up and then copied onto each
 * answer: the same headers, without running a dozen middleware functions per request.
 */
export function fixedHeaders(middleware: NodeMiddleware): RequestHandler {
  const headers: [string, string][] = [];
  const record = {
    setHeader(name: string, value: string | number | readonly string[]) {
      if (typeof value !== 'string') throw new Error(`${name}: only fixed text headers can be worked out once`);
      headers.push([name, value]);
    },
    removeHeader() {},
    getHeader: () => undefined,
  };
  let failed: unknown;
  let done = false;
  middleware({ method: 'GET', url: '/', headers: {} } as IncomingMessage, record as unknown as ServerResponse, (err) => {
    failed = err;
    done = true;
  });
  if (!done || failed) throw new Error(`the headers could not be worked out once: ${String(failed ?? 'the middleware did not finish at once')}`);
  return (_req, res, next) => {
    for (const [name, value] of headers) res.setHeader(name, value);
    next();
  };
}
