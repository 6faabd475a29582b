import { dialectOf, jsonTextSql } from '../../server/db/dialect';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorBodySchema } from '../../shared/schemas/error.schema';
import { sessionBodySchema } from '../../shared/schemas/auth.schema';
import { Client, createTestApp, type TestApp } from '../setup/test-app';
import { makeOrgWithUser, makeUser, TEST_PASSWORD } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '3', RESET_RATE_LIMIT: '50' });
});
afterAll(async () => t.close());

const tokenFrom = (text: string, pathPart: string) => {
  const m = text.match(new RegExp(`${pathPart}([A-Za-z0-9_-]{20,})`));
  if (!m) throw new Error(`no token link (${pathPart}) in: ${text}`);
  return m[1];
};

describe('sign-up', () => {
  it('creates a contractor firm with the person as its owner and signs them in', async () => {
    const c = new Client(t.app);
    const res = await c.post('/api/auth/signup', {
      organisation_name: 'Hollowmere Roofing',
      kind: 'contractor',
      name: 'Ada Quarrie',
      email: 'Ada@Hollowmere.test',
      password: 'a-long-enough-password',
    });
    expect(res.status).toBe(201);
    const body = sessionBodySchema.parse(res.body);
    expect(body.user).toMatchObject({ email: 'ada@hollowmere.test', role: 'contractor_owner' });
    expect(body.organisation).toMatchObject({ name: 'Hollowmere Roofing', kind: 'contractor' });
    const me = await c.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe('ada@hollowmere.test');
  });

  it('answers a taken e-mail with a neutral message that does not confirm the account exists', async () => {
    const { email } = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
    const res = await new Client(t.app).post('/api/auth/signup', {
      organisation_name: 'Another firm',
      kind: 'merchant',
      name: 'Someone',
      email,
      password: 'a-long-enough-password',
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('signup_failed');
    expect(res.body.error.message).not.toMatch(/exists|taken|registered/i);
  });

  it('rejects a short password and a bad e-mail with 422 and the field paths', async () => {
    const res = await new Client(t.app).post('/api/auth/signup', {
      organisation_name: 'Firm',
      kind: 'contractor',
      name: 'Someone',
      email: 'not-an-email',
      password: 'short',
    });
    expect(res.status).toBe(422);
    const body = errorBodySchema.parse(res.body);
    expect(body.error.code).toBe('validation_failed');
    expect(body.error.details?.map((d) => d.path).sort()).toEqual(['email', 'password']);
  });
});

describe('sign-in and sign-out', () => {
  it('signs in with the right password, returning the user and organisation, and regenerates the session id', async () => {
    const u = await makeOrgWithUser(t.db, 'merchant', 'merchant_sales');
    const c = new Client(t.app);
    const before = await c.agent.get('/api/auth/csrf');
    const cookieBefore = String(before.headers['set-cookie']);
    const res = await c.post('/api/auth/login', { email: u.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      user: { id: u.userId, email: u.email, name: expect.any(String), role: 'merchant_sales' },
      organisation: { id: u.organisationId, name: expect.any(String), kind: 'merchant' },
      calendar: { time_zone: 'Europe/London', today: t.config.calendar.today() },
      currency: 'GBP',
    });
    const cookieAfter = String(res.headers['set-cookie']);
    expect(cookieAfter).toMatch(/ridgeload\.sid=/);
    expect(cookieAfter).toMatch(/HttpOnly/i);
    expect(cookieAfter).toMatch(/SameSite=Lax/i);
    expect(cookieAfter.split(';')[0]).not.toBe(cookieBefore.split(';')[0]);
  });

  it('refuses a wrong password and an unknown e-mail with the same 401 message', async () => {
    const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator');
    const wrong = await new Client(t.app).post('/api/auth/login', { email: u.email, password: 'wrong-password' });
    const unknown = await new Client(t.app).post('/api/auth/login', { email: 'nobody@nowhere.test', password: 'wrong-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(errorBodySchema.parse(wrong.body).error.code).toBe('invalid_credentials');
  });

  it('limits failed sign-ins for one e-mail and answers 429 past the limit', async () => {
    const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
    const c = new Client(t.app);
    for (let i = 0; i < 3; i++) expect((await c.post('/api/auth/login', { email: u.email, password: 'nope-nope' })).status).toBe(401);
    const blocked = await c.post('/api/auth/login', { email: u.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('rate_limited');
  });

  it('signs out: /me answers 401 afterwards', async () => {
    const u = await makeOrgWithUser(t.db, 'merchant', 'driver');
    const c = new Client(t.app);
    expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
    expect((await c.post('/api/auth/logout')).status).toBe(204);
    const me = await c.get('/api/auth/me');
    expect(me.status).toBe(401);
    expect(me.body.error.code).toBe('unauthenticated');
  });

  it('refuses a state-changing request without the CSRF token', async () => {
    const res = await new Client(t.app).agent.post('/api/auth/login').send({ email: 'a@b.test', password: 'x' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_invalid');
  });
});

describe('password reset', () => {
  it('mails a single-use link; the new password works and the link does not work twice', async () => {
    const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator');
    const c = new Client(t.app);
    const res = await c.post('/api/auth/password/forgot', { email: u.email });
    expect(res.status).toBe(202);
    const mail = await t.mail.waitFor(u.email);
    expect(mail.subject).toMatch(/reset/i);
    expect(mail.html).toContain('reset-password?token=');
    const token = tokenFrom(mail.text, 'reset-password\\?token=');
    expect((await c.post('/api/auth/password/reset', { token, password: 'a-brand-new-password' })).status).toBe(200);
    const again = await c.post('/api/auth/password/reset', { token, password: 'yet-another-password' });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('token_invalid');
    expect((await new Client(t.app).login(u.email, 'a-brand-new-password')).status).toBe(200);
    expect((await new Client(t.app).login(u.email, TEST_PASSWORD)).status).toBe(401);
  });

  it('signs out every session that held the old password, and no one else', async () => {
    const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator');
    const other = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator');
    const laptop = new Client(t.app);
    const phone = new Client(t.app);
    const colleague = new Client(t.app);
    expect((await laptop.login(u.email, TEST_PASSWORD)).status).toBe(200);
    expect((await phone.login(u.email, TEST_PASSWORD)).status).toBe(200);
    expect((await colleague.login(other.email, TEST_PASSWORD)).status).toBe(200);
    expect((await phone.get('/api/auth/me')).status).toBe(200);

    const c = new Client(t.app);
    await c.post('/api/auth/password/forgot', { email: u.email });
    const token = tokenFrom((await t.mail.waitFor(u.email)).text, 'reset-password\\?token=');
    expect((await c.post('/api/auth/password/reset', { token, password: 'a-brand-new-password' })).status).toBe(200);

    expect((await laptop.get('/api/auth/me')).status).toBe(401);
    expect((await phone.get('/api/auth/me')).status).toBe(401);
    expect((await colleague.get('/api/auth/me')).status).toBe(200);
    const left = await t
      .db('sessions')
      .whereRaw(`${jsonTextSql(t.db, ['passport', 'user'])} = ?`, ['sess', dialectOf(t.db) === 'postgres' ? String(u.userId) : u.userId])
      .count({ n: '*' })
      .first();
    expect(Number(left?.n)).toBe(0);
  });

  it('answers an unknown e-mail exactly as a known one and sends nothing', async () => {
    const before = t.mail.messages.length;
    const res = await new Client(t.app).post('/api/auth/password/forgot', { email: 'ghost@nowhere.test' });
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ ok: true });
    await new Promise((r) => setTimeout(r, 200));
    expect(t.mail.messages.length).toBe(before);
  });

  it('limits reset requests from one address and answers 429 past the limit', async () => {
    const limited = await createTestApp({ RESET_RATE_LIMIT: '2' });
    try {
      const c = new Client(limited.app);
      expect((await c.post('/api/auth/password/forgot', { email: 'a@nowhere.test' })).status).toBe(202);
      expect((await c.post('/api/auth/password/forgot', { email: 'b@nowhere.test' })).status).toBe(202);
      const blocked = await c.post('/api/auth/password/forgot', { email: 'c@nowhere.test' });
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('rate_limited');
    } finally {
      await limited.close();
    }
  });

  it('refuses an expired token', async () => {
    const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator');
    const c = new Client(t.app);
    await c.post('/api/auth/password/forgot', { email: u.email });
    const token = tokenFrom((await t.mail.waitFor(u.email)).text, 'reset-password\\?token=');
    await t
      .db('password_resets')
      .where({ user_id: u.userId })
      .update({ expires_at: new Date(Date.now() - 1000).toISOString() });
    const res = await c.post('/api/auth/password/reset', { token, password: 'a-brand-new-password' });
    expect(res.status).toBe(400);
  });
});

describe('invitations', () => {
  it('an owner invites by e-mail; the invitee accepts with the mailed token, joins with that role, and the token is then spent', async () => {
    const owner = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner', 'Marrowby Tiles');
    const c = new Client(t.app);
    await c.login(owner.email, TEST_PASSWORD);
    const inv = await c.post('/api/invitations', { email: 'new.driver@marrowby.test', role: 'driver' });
    expect(inv.status).toBe(201);
    expect((await c.get('/api/invitations')).body.invitations.map((i: { email: string }) => i.email)).toContain('new.driver@marrowby.test');
    const mail = await t.mail.waitFor('new.driver@marrowby.test');
    expect(mail.text).toContain('Marrowby Tiles');
    expect(mail.html).toBeTruthy();
    const token = tokenFrom(mail.text, '/invitations/');

    const invitee = new Client(t.app);
    const preview = await invitee.get(`/api/invitations/${token}`);
    expect(preview.body).toEqual({ email: 'new.driver@marrowby.test', role: 'driver', organisation: { name: 'Marrowby Tiles', kind: 'merchant' } });
    const accepted = await invitee.post(`/api/invitations/${token}/accept`, { name: 'Lior Tabb', password: 'driver-password-1' });
    expect(accepted.status).toBe(201);
    expect(accepted.body.user.role).toBe('driver');
    expect(accepted.body.organisation.id).toBe(owner.organisationId);
    expect((await new Client(t.app).post(`/api/invitations/${token}/accept`, { name: 'X', password: 'another-password' })).status).toBe(404);
    expect((await new Client(t.app).login('new.driver@marrowby.test', 'driver-password-1')).status).toBe(200);
  });

  it('refuses a role that does not belong to the firm’s kind, naming the field', async () => {
    const owner = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
    const c = new Client(t.app);
    await c.login(owner.email, TEST_PASSWORD);
    const res = await c.post('/api/invitations', { email: 'someone@firm.test', role: 'driver' });
    expect(res.status).toBe(422);
    expect(res.body.error.details[0].path).toBe('role');
  });

  it('an estimator may not invite (403)', async () => {
    const est = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator');
    const c = new Client(t.app);
    await c.login(est.email, TEST_PASSWORD);
    const res = await c.post('/api/invitations', { email: 'someone@firm.test', role: 'contractor_estimator' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
  });

  it('a revoked invitation can no longer be previewed or accepted', async () => {
    const owner = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
    const c = new Client(t.app);
    await c.login(owner.email, TEST_PASSWORD);
    const inv = await c.post('/api/invitations', { email: 'revoked@firm.test', role: 'contractor_estimator' });
    const token = tokenFrom((await t.mail.waitFor('revoked@firm.test')).text, '/invitations/');
    expect((await c.delete(`/api/invitations/${inv.body.id}`)).status).toBe(204);
    expect((await new Client(t.app).get(`/api/invitations/${token}`)).status).toBe(404);
  });
});

describe('members', () => {
  it('an owner changes a member’s role and removes them; the last owner cannot be demoted', async () => {
    const owner = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
    const member = await makeUser(t.db, owner.organisationId, 'merchant_sales');
    const c = new Client(t.app);
    await c.login(owner.email, TEST_PASSWORD);
    const changed = await c.patch(`/api/members/${member.userId}`, { role: 'merchant_dispatcher' });
    expect(changed.status).toBe(200);
    expect(changed.body.role).toBe('merchant_dispatcher');
    const demote = await c.patch(`/api/members/${owner.userId}`, { role: 'merchant_sales' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_owner');
    expect((await c.delete(`/api/members/${owner.userId}`)).body.error.code).toBe('cannot_remove_self');
    expect((await c.delete(`/api/members/${member.userId}`)).status).toBe(204);
    const list = await c.get('/api/members');
    expect(list.body.members.map((m: { id: number }) => m.id)).toEqual([owner.userId]);
  });
});
