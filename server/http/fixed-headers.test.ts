import express from 'express';
import helmet from 'helmet';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { fixedHeaders } from './fixed-headers';

const appWith = (middleware: express.RequestHandler) => {
  const app = express();
  app.disable('x-powered-by');
  app.use(middleware);
  app.get('/x', (_req, res) => void res.json({ ok: true }));
  return app;
};
const options = { contentSecurityPolicy: { directives: { 'default-src': ["'self'"], 'img-src': ["'self'", 'data:'], 'upgrade-insecure-requests': null } } };
const securityHeaders = (headers: Record<string, string>) => Object.fromEntries(Object.entries(headers).filter(([k]) => !['date', 'etag', 'content-length', 'content-type', 'connection', 'keep-alive'].includes(k)));

describe('headers worked out once', () => {
  it('are exactly the headers helmet sets on an answer', async () => {
    const direct = await request(appWith(helmet(options))).get('/x');
    const once = await request(appWith(fixedHeaders(helmet(options)))).get('/x');
    expect(Object.keys(securityHeaders(direct.headers as Record<string, string>)).length).toBeGreaterThan(10);
    expect(securityHeaders(once.headers as Record<string, string>)).toEqual(securityHeaders(direct.headers as Record<string, string>));
  });

  it('refuse a middleware that sets anything but text, or does not finish at once', () => {
    const perRequest = (_req: unknown, res: { setHeader: (n: string, v: unknown) => void }, next: () => void) => {
      res.setHeader('Content-Security-Policy', ['a', 'b']);
      next();
    };
    expect(() => fixedHeaders(perRequest as never)).toThrow(/fixed text headers/);
    const asynchronous = (_req: unknown, _res: unknown, next: () => void) => void setTimeout(next, 0);
    expect(() => fixedHeaders(asynchronous as never)).toThrow(/did not finish at once/);
  });
});
