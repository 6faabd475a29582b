import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { TEST_PASSWORD, makeOrgWithUser, makeUser } from '../setup/factories';
import { Client, twoServersOnOneDatabase, type TestApp } from '../setup/test-app';

// Two servers on one database (two app objects with no memory in common): whatever one of them
// does to a sign-in, the other sees on the very next request.
let a: TestApp;
let b: TestApp;
twoServersOnOneDatabase({ LOGIN_RATE_LIMIT: '100' }, (x, y) => {
  a = x;
  b = y;
});

/** Signs in on server A and returns the session cookie, to be carried to server B as a browser would behind a balancer. */
async function signInOnA(email: string) {
  const c = new Client(a.app);
  expect((await c.login(email, TEST_PASSWORD)).status).toBe(200);
  const cookie = String((await c.get('/api/auth/csrf')).headers['set-cookie'] ?? '') || undefined;
  return { client: c, cookie: cookie ?? (await cookieOf(c)) };
}
async function cookieOf(c: Client): Promise<string> {
  const jar = (c.agent as unknown as { jar: { getCookies: (o: object) => { toValueString: () => string }[] } }).jar;
  return jar
    .getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false })
    .map((k) => k.toValueString())
    .join('; ');
}
const meOnB = (cookie: string) => request(b.app).get('/api/auth/me').set('Cookie', cookie);

describe('two servers on one database', () => {
  it('a session made on one server works on the other, and signing out on one ends it on both', async () => {
    const u = await makeOrgWithUser(a.db, 'contractor', 'contractor_estimator');
    const { client, cookie } = await signInOnA(u.email);
    expect((await meOnB(cookie)).status).toBe(200);
    expect((await client.post('/api/auth/logout')).status).toBe(204);
    expect((await meOnB(cookie)).status).toBe(401);
  });

  it('a role changed on one server counts on the other at the next request', async () => {
    const owner = await makeOrgWithUser(a.db, 'merchant', 'merchant_owner');
    const member = await makeUser(a.db, owner.organisationId, 'merchant_dispatcher');
    const { cookie } = await signInOnA(member.email);
    expect((await meOnB(cookie)).body.user.role).toBe('merchant_dispatcher');
    const ownerOnA = new Client(a.app);
    await ownerOnA.login(owner.email, TEST_PASSWORD);
    expect((await ownerOnA.patch(`/api/members/${member.userId}`, { role: 'driver' })).status).toBe(200);
    expect((await meOnB(cookie)).body.user.role).toBe('driver');
    // And a write the old role allowed is refused on B.
    const csrf = await request(b.app).get('/api/auth/csrf').set('Cookie', cookie);
    const lorry = await request(b.app)
      .post(`/api/branches/${owner.branchId}/lorries`)
      .set('Cookie', cookie)
      .set('X-CSRF-Token', csrf.body.token)
      .send({ registration: 'RL-TWO1', name: 'Second server', payload_kg: 10_000, pallet_slots: 10, has_crane: false });
    expect(lorry.status).toBe(403);
  });

  it('a member removed on one server is signed out on the other', async () => {
    const owner = await makeOrgWithUser(a.db, 'merchant', 'merchant_owner');
    const member = await makeUser(a.db, owner.organisationId, 'merchant_sales');
    const { cookie } = await signInOnA(member.email);
    expect((await meOnB(cookie)).status).toBe(200);
    const ownerOnA = new Client(a.app);
    await ownerOnA.login(owner.email, TEST_PASSWORD);
    expect((await ownerOnA.delete(`/api/members/${member.userId}`)).status).toBe(204);
    expect((await meOnB(cookie)).status).toBe(401);
  });

  it('a password reset on one server ends the sessions held on the other', async () => {
    const u = await makeOrgWithUser(a.db, 'contractor', 'contractor_owner');
    const { cookie } = await signInOnA(u.email);
    expect((await meOnB(cookie)).status).toBe(200);
    const c = new Client(a.app);
    expect((await c.post('/api/auth/password/forgot', { email: u.email })).status).toBe(202);
    const mail = await a.mail.waitFor(u.email);
    const token = /reset-password\?token=([A-Za-z0-9_-]+)/.exec(mail.text)![1];
    expect((await c.post('/api/auth/password/reset', { token, password: 'a-brand-new-password' })).status).toBe(200);
    expect((await meOnB(cookie)).status).toBe(401);
  });
});
