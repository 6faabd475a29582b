import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { TEST_PASSWORD, makeOrgWithUser } from '../setup/factories';
import { Client, twoServersOnOneDatabase, type TestApp } from '../setup/test-app';

// The session cookie rolls (7 days from last use) without going out on every answer: it is sent
// again only when its expiry moves, at most once a minute, and every server decides from the table.
let a: TestApp;
let b: TestApp;
twoServersOnOneDatabase({ LOGIN_RATE_LIMIT: '100' }, (x, y) => {
  a = x;
  b = y;
});

const WEEK = 7 * 86_400_000;

async function signedIn(): Promise<{ cookie: string; sid: string }> {
  const u = await makeOrgWithUser(a.db, 'merchant', 'merchant_sales');
  const c = new Client(a.app);
  const res = await c.login(u.email, TEST_PASSWORD);
  expect(res.status).toBe(200);
  const cookie = sessionCookies(res)[0].split(';')[0];
  const sid = decodeURIComponent(cookie.slice('ridgeload.sid='.length)).slice(2).split('.')[0];
  return { cookie, sid };
}
const sessionCookies = (res: request.Response) => ([] as string[]).concat(res.headers['set-cookie'] ?? []).filter((c) => c.startsWith('ridgeload.sid='));
const expiresOf = (setCookie: string) => Date.parse(/expires=([^;]+)/i.exec(setCookie)![1]);
const storedExpiry = async (sid: string) => new Date((await a.db('sessions').where({ sid }).first('expired')).expired as string | Date).getTime();
const storeExpiry = (sid: string, at: number) =>
  a
    .db('sessions')
    .where({ sid })
    .update({ expired: new Date(at).toISOString() });

describe('the rolling session cookie', () => {
  it('is not sent again on answers while the session’s expiry has not moved', async () => {
    const { cookie } = await signedIn();
    for (const app of [a.app, b.app, a.app]) {
      const res = await request(app).get('/api/auth/me').set('Cookie', cookie);
      expect(res.status).toBe(200);
      expect(sessionCookies(res)).toEqual([]);
    }
  });

  it('is sent again with the new expiry once the stored one is a minute or more behind, by whichever server, and then not again', async () => {
    const { cookie, sid } = await signedIn();
    await storeExpiry(sid, Date.now() + WEEK - 5 * 60_000);
    const before = Date.now();
    const res = await request(b.app).get('/api/auth/me').set('Cookie', cookie);
    expect(res.status).toBe(200);
    const sent = sessionCookies(res);
    expect(sent).toHaveLength(1);
    // The same session, HttpOnly and SameSite=Lax as at sign-in, now expiring a week from this use (cookie dates are to the second).
    expect(sent[0].split(';')[0]).toBe(cookie);
    expect(sent[0].toLowerCase()).toContain('httponly');
    expect(sent[0].toLowerCase()).toContain('samesite=lax');
    expect(expiresOf(sent[0])).toBeGreaterThanOrEqual(Math.floor((before + WEEK) / 1000) * 1000);
    expect(expiresOf(sent[0])).toBeLessThanOrEqual(Date.now() + WEEK);
    // The table moved with it, so the other server does not send it again.
    expect(await storedExpiry(sid)).toBeGreaterThanOrEqual(before + WEEK);
    for (const app of [a.app, b.app]) expect(sessionCookies(await request(app).get('/api/auth/me').set('Cookie', cookie))).toEqual([]);
  });

  it('keeps a session whose expiry has passed signed out, and does not bring it back', async () => {
    const { cookie, sid } = await signedIn();
    await storeExpiry(sid, Date.now() - 1000);
    const res = await request(a.app).get('/api/auth/me').set('Cookie', cookie);
    expect(res.status).toBe(401);
    expect(sessionCookies(res)).toEqual([]);
    expect(await storedExpiry(sid)).toBeLessThan(Date.now());
  });

  it('signs nobody in with a cookie whose signature does not match, or that names another session', async () => {
    const { cookie } = await signedIn();
    const value = decodeURIComponent(cookie.slice('ridgeload.sid='.length));
    const [sid, mac] = [value.slice(2, value.lastIndexOf('.')), value.slice(value.lastIndexOf('.') + 1)];
    const flipped = `${mac.slice(0, -1)}${mac.endsWith('A') ? 'B' : 'A'}`;
    for (const forged of [`s:${sid}.${flipped}`, `s:${sid}x.${mac}`, `${sid}.${mac}`, `s:${sid}`]) {
      expect(
        (
          await request(a.app)
            .get('/api/auth/me')
            .set('Cookie', `ridgeload.sid=${encodeURIComponent(forged)}`)
        ).status,
      ).toBe(401);
    }
    // Another cookie whose name ends the same way is not the session cookie.
    expect((await request(a.app).get('/api/auth/me').set('Cookie', `x${cookie}`)).status).toBe(401);
    expect((await request(a.app).get('/api/auth/me').set('Cookie', `theme=dark; ${cookie}`)).status).toBe(200);
  });
});
