import { describe, expect, it } from 'vitest';
import { TEST_PASSWORD, makeOrgWithUser } from '../setup/factories';
import { Client, twoServersOnOneDatabase, type TestApp } from '../setup/test-app';

// Two servers on one database (two app objects, nothing in memory in common): the sign-in and
// reset limits count every try on either server against one allowance.
let a: TestApp;
let b: TestApp;
twoServersOnOneDatabase({ LOGIN_RATE_LIMIT: '10', RESET_RATE_LIMIT: '5' }, (x, y) => {
  a = x;
  b = y;
});

const tryLogin = (t: TestApp, email: string, password = 'not-the-password') => new Client(t.app).post('/api/auth/login', { email, password });

describe('rate limits shared by every server on one database', () => {
  it('failed sign-ins on two servers add up: six on A and four on B reach the limit of ten on both', async () => {
    const u = await makeOrgWithUser(a.db, 'contractor', 'contractor_owner');
    for (let i = 0; i < 6; i++) expect((await tryLogin(a, u.email)).status).toBe(401);
    for (let i = 0; i < 4; i++) expect((await tryLogin(b, u.email)).status).toBe(401);
    // Even the right password is refused now, on either server.
    for (const t of [a, b]) {
      const blocked = await tryLogin(t, u.email, TEST_PASSWORD);
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('rate_limited');
    }
    // Another person's e-mail from the same address has its own count.
    const other = await makeOrgWithUser(a.db, 'contractor', 'contractor_owner');
    expect((await tryLogin(b, other.email, TEST_PASSWORD)).status).toBe(200);
  });

  it('a successful sign-in on one server takes back its try on the count both servers read', async () => {
    const u = await makeOrgWithUser(a.db, 'merchant', 'merchant_sales');
    for (let i = 0; i < 9; i++) expect((await tryLogin(i % 2 ? a : b, u.email)).status).toBe(401);
    for (let i = 0; i < 3; i++) expect((await tryLogin(i % 2 ? a : b, u.email, TEST_PASSWORD)).status).toBe(200);
    expect((await tryLogin(a, u.email)).status).toBe(401); // the tenth failure
    expect((await tryLogin(b, u.email, TEST_PASSWORD)).status).toBe(429);
  });

  it('reset requests from one address count on both servers, and a new window starts the count again', async () => {
    const ask = (t: TestApp, n: number) => new Client(t.app).post('/api/auth/password/forgot', { email: `nobody-${n}@nowhere.test` });
    for (let i = 0; i < 3; i++) expect((await ask(a, i)).status).toBe(202);
    for (let i = 3; i < 5; i++) expect((await ask(b, i)).status).toBe(202);
    expect((await ask(a, 5)).status).toBe(429);
    expect((await ask(b, 6)).status).toBe(429);
    // The reset route shares the allowance with the request route.
    const reset = await new Client(b.app).post('/api/auth/password/reset', { token: 'x'.repeat(43), password: 'a-brand-new-password' });
    expect(reset.status).toBe(429);
    // The window ends (as if fifteen minutes had passed): the next request counts as the first.
    const rows = await a.db('rate_limit_hits').where('key', 'like', 'reset:%');
    expect(rows.map((r) => Number(r.hits))).toEqual([8]); // five let through, three refused
    await a
      .db('rate_limit_hits')
      .where('key', 'like', 'reset:%')
      .update({ reset_at: new Date(Date.now() - 1000).toISOString() });
    expect((await ask(b, 7)).status).toBe(202);
    expect((await a.db('rate_limit_hits').where('key', 'like', 'reset:%').first()).hits).toBe(1);
  });
});
