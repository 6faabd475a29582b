import pino from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { listRoutes } from '../../server/http/route-inventory';
import { PAYMENT_WEBHOOK_PATH } from '../../server/payments/dev-payments';
import { Client, createTestApp, type TestApp } from '../setup/test-app';
import { makeOrgWithUser, TEST_PASSWORD } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const sessionCookie = (res: request.Response) => {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const c = cookies.find((x) => x.startsWith('ridgeload.sid='));
  if (!c) throw new Error(`no session cookie in ${JSON.stringify(cookies)}`);
  return c.split(';').map((p) => p.trim().toLowerCase());
};

describe('the session cookie', () => {
  it('is HttpOnly and SameSite=Lax, and not Secure outside production (plain http on loopback)', async () => {
    const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
    const c = new Client(t.app);
    const res = await c.login(u.email, TEST_PASSWORD);
    expect(res.status).toBe(200);
    const parts = sessionCookie(res);
    expect(parts).toContain('httponly');
    expect(parts).toContain('samesite=lax');
    expect(parts).not.toContain('secure');
  });

  it('is Secure, HttpOnly and SameSite=Lax in production', async () => {
    const prod = createApp({ config: { ...t.config, isProduction: true }, db: t.db, mailer: t.mail.mailer, logger: pino({ level: 'silent' }) });
    const res = await request(prod).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https');
    expect(res.status).toBe(200);
    const parts = sessionCookie(res);
    expect(parts).toContain('secure');
    expect(parts).toContain('httponly');
    expect(parts).toContain('samesite=lax');
    // Over plain http a production server never hands the cookie out at all.
    const plain = await request(prod).get('/api/auth/csrf');
    expect(([] as string[]).concat(plain.headers['set-cookie'] ?? []).some((x) => x.startsWith('ridgeload.sid='))).toBe(false);
  });
});

describe('CSRF on every write', () => {
  const writes = () => listRoutes(t.app).filter((r) => r.path.startsWith('/api/') && r.method !== 'GET' && r.method !== 'HEAD' && r.path !== PAYMENT_WEBHOOK_PATH);
  const concrete = (path: string) => path.replace(/:token/g, 'a'.repeat(43)).replace(/:[A-Za-z]+/g, '1');

  it('finds the writes in the route inventory (sign-in among them) and leaves out only the signed payment webhook', () => {
    const all = listRoutes(t.app).filter((r) => r.path.startsWith('/api/') && r.method !== 'GET');
    const kept = new Set(writes().map((r) => `${r.method} ${r.path}`));
    const left = all.map((r) => `${r.method} ${r.path}`).filter((k) => !kept.has(k));
    expect(left).toEqual(['POST /api/payments/webhook']);
    expect(writes().map((r) => `${r.method} ${r.path}`)).toContain('POST /api/auth/login');
    expect(writes().length).toBeGreaterThan(40);
  });

  it('refuses every write without the token, with a wrong token and with another session’s token, signed in or not (403 csrf_invalid), changing nothing', async () => {
    const owner = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
    const signedIn = new Client(t.app);
    expect((await signedIn.login(owner.email, TEST_PASSWORD)).status).toBe(200);
    const stranger = new Client(t.app);
    const othersToken = await stranger.csrf();
    const anonymous = new Client(t.app);
    await anonymous.csrf();
    const tables = ['users', 'organisations', 'orders', 'projects', 'invitations', 'products', 'sessions'];
    const count = async () => Object.fromEntries(await Promise.all(tables.map(async (x) => [x, Number((await t.db(x).count({ n: '*' }).first())?.n)] as const)));
    const before = await count();
    const failures: string[] = [];
    for (const r of writes()) {
      const path = concrete(r.path);
      const method = r.method.toLowerCase() as 'post' | 'put' | 'patch' | 'delete';
      for (const [who, agent] of [
        ['signed in', signedIn.agent],
        ['signed out', anonymous.agent],
      ] as const) {
        for (const [label, token] of [
          ['no token', undefined],
          ['a wrong token', 'x'.repeat(43)],
          ['another session’s token', othersToken],
        ] as const) {
          let req = agent[method](path).send({ email: owner.email, password: TEST_PASSWORD, name: 'Csrf', role: 'merchant_sales' });
          if (token) req = req.set('X-CSRF-Token', token);
          const res = await req;
          if (res.status !== 403 || res.body?.error?.code !== 'csrf_invalid') failures.push(`${r.method} ${r.path} ${who} with ${label}: ${res.status}`);
        }
      }
    }
    expect(failures).toEqual([]);
    const after = await count();
    expect({ ...after, sessions: 0 }).toEqual({ ...before, sessions: 0 });
  });
});
