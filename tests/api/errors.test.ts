import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorBodySchema } from '../../shared/schemas/error.schema';
import { Client, createTestApp, type TestApp } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

describe('error bodies', () => {
  it('GET /api/health answers ok with the database reachable, and the mail outbox empty', async () => {
    const res = await new Client(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true, mail: { queued: 0, sending: 0, failed: 0, oldest_queued_age_s: null } });
  });

  it('malformed JSON → 400 malformed_json', async () => {
    const c = new Client(t.app);
    const token = await c.csrf();
    const res = await c.agent.post('/api/auth/login').set('X-CSRF-Token', token).set('Content-Type', 'application/json').send('{"email": ');
    expect(res.status).toBe(400);
    expect(errorBodySchema.parse(res.body).error.code).toBe('malformed_json');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts|node_modules/);
  });

  it('an oversized body → 413 payload_too_large', async () => {
    const c = new Client(t.app);
    const token = await c.csrf();
    const big = JSON.stringify({ email: 'a@b.test', password: 'x'.repeat(1_100_000) });
    const res = await c.agent.post('/api/auth/login').set('X-CSRF-Token', token).set('Content-Type', 'application/json').send(big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it('a method no route under that path answers → 404; OPTIONS still lists the methods there', async () => {
    const c = new Client(t.app);
    const res = await c.get('/api/auth/login');
    expect(res.status).toBe(404);
    expect(errorBodySchema.parse(res.body).error.code).toBe('route_not_found');
    const options = await c.agent.options('/api/auth/login');
    expect(options.status).toBe(200);
    expect(options.headers.allow).toContain('POST');
  });

  it('an unknown API route → 404 in the error shape', async () => {
    const res = await new Client(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(errorBodySchema.parse(res.body).error.code).toBe('route_not_found');
  });

  it('a signed-out request to a protected route → 401', async () => {
    const res = await new Client(t.app).get('/api/members');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('validation failure → 422 with zod field paths', async () => {
    const res = await new Client(t.app).post('/api/auth/login', { email: 'nope' });
    expect(res.status).toBe(422);
    const paths = errorBodySchema.parse(res.body).error.details?.map((d) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['email', 'password']));
  });
});
