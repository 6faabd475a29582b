import express, { type Express } from 'express';
import pino from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { createTestApp, type TestApp } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await t.db('dev_outbox').insert({
    from: 'no-reply@ridgeload.test',
    to: 'someone@firm.test',
    subject: 'Reset your Ridgeload password',
    text: 'reset-password?token=secret',
    html: '',
    created_at: new Date().toISOString(),
  });
});
afterAll(async () => t.close());

/** The app as a request from another machine reaches it: the socket's peer is not this machine. */
function fromAddress(app: Express, address: string): Express {
  const outer = express();
  outer.set('trust proxy', true);
  outer.use((req, _res, next) => {
    Object.defineProperty(req.socket, 'remoteAddress', { value: address, configurable: true });
    next();
  });
  outer.use(app);
  return outer;
}

describe('the development mail reader answers this machine only', () => {
  it('serves the outbox to a request from loopback outside production', async () => {
    const res = await request(t.app).get('/api/dev/outbox');
    expect(res.status).toBe(200);
    expect(res.body.messages[0].text).toContain('token=secret');
  });

  for (const address of ['203.0.113.9', '::ffff:198.51.100.4', '10.0.0.7', '2001:db8::1']) {
    it(`refuses the outbox API and page with 404 to a request from ${address}`, async () => {
      const api = await request(fromAddress(t.app, address)).get('/api/dev/outbox');
      expect(api.status).toBe(404);
      expect(api.body.error.code).toBe('route_not_found');
      expect(JSON.stringify(api.body)).not.toContain('secret');
      const page = await request(fromAddress(t.app, address)).get('/outbox');
      expect(page.status).toBe(404);
      expect((await request(fromAddress(t.app, address)).get('/outbox/1')).status).toBe(404);
    });
  }

  it('is not fooled by a proxy header claiming loopback, even when the app trusts proxies', async () => {
    t.app.set('trust proxy', true);
    try {
      for (const header of ['127.0.0.1', '::1', '127.0.0.1, 127.0.0.1']) {
        const res = await request(fromAddress(t.app, '203.0.113.9')).get('/api/dev/outbox').set('X-Forwarded-For', header).set('X-Real-IP', '127.0.0.1');
        expect(res.status, header).toBe(404);
      }
    } finally {
      t.app.set('trust proxy', false);
    }
  });

  it('is not there at all in production, even from loopback', async () => {
    const prod = createApp({ config: { ...t.config, isProduction: true }, db: t.db, mailer: t.mail.mailer, logger: pino({ level: 'silent' }) });
    expect((await request(prod).get('/api/dev/outbox')).status).toBe(404);
    expect((await request(prod).get('/outbox')).status).toBe(404);
  });
});
