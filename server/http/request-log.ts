import type { RequestHandler } from 'express';
import type { Logger } from 'pino';

declare module 'http' {
  interface IncomingMessage {
    /** The app's logger, for the error handler (set by requestLog). */
    log?: Logger;
    /** A number per request, on its log line. */
    id?: number;
  }
}

/**
 * One log line per answered request: `{req: {id, method, url}, res: {status}, responseTime}`,
 * "request completed" (or "request aborted" when the client went away first), at info level.
 * When info is off nothing is done per request (errors are logged by the error handler, with their
 * request); no child logger or serializer is made per request either way.
 */
export function requestLog(logger: Logger, ignore: (url: string) => boolean = () => false): RequestHandler {
  let lastId = 0;
  return (req, res, next) => {
    req.log = logger;
    if (!logger.isLevelEnabled('info') || ignore(req.url)) return next();
    const id = ++lastId;
    req.id = id;
    const { method, url } = req;
    const start = performance.now();
    res.once('close', () => {
      const finished = res.writableFinished;
      logger.info({ req: { id, method, url }, res: { status: res.statusCode }, responseTime: Math.round(performance.now() - start) }, finished ? 'request completed' : 'request aborted');
    });
    next();
  };
}
