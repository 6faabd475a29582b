import type { Request } from 'express';
import type { SessionData } from 'express-session';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createDb, migrateLatest, type Db } from '../db/knex';
import { SessionStore } from './session-store';

let db: Db;
let store: SessionStore;
beforeAll(async () => {
  db = createDb(':memory:');
  store = new SessionStore(db);
  await new Promise<void>((resolve) => void store.length(() => resolve())); // waits for the store's table
});
afterAll(async () => db.destroy());

const DAY = 86_400_000;
const session = (user: number, expiresInMs = 7 * DAY) =>
  ({ cookie: { originalMaxAge: expiresInMs, maxAge: expiresInMs, expires: new Date(Date.now() + expiresInMs), httpOnly: true, path: '/' }, passport: { user } }) as unknown as SessionData;
type Stored = SessionData & { passport?: { user: number } };
const get = (sid: string) => new Promise<Stored | null | undefined>((resolve, reject) => void store.get(sid, (err, s) => (err ? reject(err) : resolve(s))));
const stored = (sid: string) => db('sessions').where({ sid }).first() as Promise<{ sess: string; expired: string } | undefined>;

describe('the session store', () => {
  it('writes a session to the database and reads it back', async () => {
    await store.set('a', session(11));
    expect(JSON.parse((await stored('a'))!.sess).passport).toEqual({ user: 11 });
    expect((await get('a'))?.passport).toEqual({ user: 11 });
  });

  it('reads a session from the database on every request, so a change another server made counts at once', async () => {
    await store.set('b', session(12));
    await db('sessions')
      .where({ sid: 'b' })
      .update({ sess: JSON.stringify({ ...session(99) }) });
    expect((await get('b'))?.passport).toEqual({ user: 99 });
    await db('sessions').where({ sid: 'b' }).delete();
    expect(await get('b')).toBeNull();
  });

  it('hands each reader its own copy', async () => {
    await store.set('c', session(13));
    const first = (await get('c'))!;
    first.passport!.user = 500;
    expect((await get('c'))?.passport).toEqual({ user: 13 });
  });

  it('reads a session it has not seen from the database (after a restart)', async () => {
    await store.set('d', session(14));
    const fresh = new SessionStore(db);
    expect(await new Promise((r) => void fresh.get('d', (_e, s) => r((s as Stored | null)?.passport)))).toEqual({ user: 14 });
  });

  it('forgets a signed-out session everywhere', async () => {
    await store.set('e', session(15));
    await store.destroy('e');
    expect(await stored('e')).toBeUndefined();
    expect(await get('e')).toBeNull();
  });

  it('does not answer with a session past its expiry', async () => {
    await store.set('f', session(16, -2000));
    expect(await get('f')).toBeNull();
  });

  it('gives the session the expiry the table holds, and moves it only through moveExpiry', async () => {
    await store.set('g', session(17, 7 * DAY));
    const firstExpiry = (await stored('g'))!.expired;
    // express-session touches every session it does not save: that writes nothing.
    await store.touch('g', session(17, 7 * DAY + 60_000));
    expect((await stored('g'))!.expired).toBe(firstExpiry);
    const later = new Date(Date.now() + 7 * DAY + 120_000);
    await store.moveExpiry('g', later);
    expect(new Date((await stored('g'))!.expired).getTime()).toBe(later.getTime());
    await store.set('g2', session(18, 40));
    await store.moveExpiry('g2', new Date(Date.now() + DAY));
    await new Promise((r) => setTimeout(r, 80));
    expect((await get('g2'))?.passport).toEqual({ user: 18 });
  });

  it('starts no timer of its own, so nothing of it runs after its database is closed', async () => {
    const own = createDb(':memory:');
    const setTimeoutSpy = vi.spyOn(globalThis, 'setTimeout');
    try {
      const fresh = new SessionStore(own);
      await new Promise<void>((resolve) => void fresh.length(() => resolve()));
      await fresh.set('t1', session(30));
      await fresh.moveExpiry('t1', new Date(Date.now() + DAY));
      // knex's own pool timers are short (and end with the pool); a cleanup of the store's own would wait a minute.
      expect(setTimeoutSpy.mock.calls.filter(([, ms]) => (ms ?? 0) >= 60_000)).toEqual([]);
    } finally {
      setTimeoutSpy.mockRestore();
      await own.destroy();
    }
  });

  it('sweeps expired sessions out of the table on its own writes, at most once a minute', async () => {
    const fresh = new SessionStore(db);
    await db('sessions').insert({ sid: 'old1', sess: JSON.stringify(session(31)), expired: new Date(Date.now() - DAY).toISOString() });
    await fresh.set('s1', session(32));
    expect(await stored('old1')).toBeUndefined();
    await db('sessions').insert({ sid: 'old2', sess: JSON.stringify(session(33)), expired: new Date(Date.now() - DAY).toISOString() });
    await fresh.set('s2', session(34));
    expect(await stored('old2')).toBeDefined();
    expect(await get('old2')).toBeNull();
  });

  it('never puts back a signed-out session when moving its expiry', async () => {
    await store.set('g3', session(19));
    await store.destroy('g3');
    await store.moveExpiry('g3', new Date(Date.now() + DAY));
    expect(await stored('g3')).toBeUndefined();
  });

  it('never puts back a session signed out while another request was still reading it', async () => {
    await store.set('h', session(18));
    const restarted = new SessionStore(db);
    const reading = new Promise<unknown>((resolve) => void restarted.get('h', (_e, s) => resolve(s)));
    await restarted.destroy('h');
    await reading;
    expect(await stored('h')).toBeUndefined();
    expect(await new Promise((r) => void restarted.get('h', (_e, s) => r(s)))).toBeNull();
  });
});

describe('the person read with the session', () => {
  let app: Db;
  let appStore: SessionStore;
  let userId: number;
  beforeAll(async () => {
    app = createDb(':memory:');
    await migrateLatest(app);
    appStore = new SessionStore(app);
    await new Promise<void>((resolve) => void appStore.length(() => resolve()));
    const now = new Date().toISOString();
    const [org] = await app('organisations').insert({ name: 'Harlow Vale Tiles', kind: 'merchant', created_at: now }).returning('id');
    const [user] = await app('users')
      .insert({ organisation_id: (org as { id: number }).id, email: 'desk@harlowvale.test', name: 'Ada Brook', role: 'merchant_sales', password_hash: 'x', created_at: now })
      .returning('id');
    userId = (user as { id: number }).id;
  });
  afterAll(async () => app.destroy());

  /** What express-session does with a stored session on a request: get() it, then createSession() on the request. */
  async function request(sid: string) {
    const req = {} as Request;
    const data = await new Promise<SessionData | null | undefined>((resolve, reject) => void appStore.get(sid, (err, s) => (err ? reject(err) : resolve(s))));
    if (data) appStore.createSession(req, data);
    return { req, data };
  }

  it('comes from the same read as the session, with the organisation, and is never stored in it', async () => {
    await appStore.set('p1', session(userId));
    const { req, data } = await request('p1');
    expect(req.signedIn?.id).toBe(userId);
    expect(req.signedIn?.user).toEqual({
      id: userId,
      email: 'desk@harlowvale.test',
      name: 'Ada Brook',
      role: 'merchant_sales',
      organisation: { id: expect.any(Number), name: 'Harlow Vale Tiles', kind: 'merchant' },
    });
    expect(Object.keys(JSON.parse(JSON.stringify(data)) as object).sort()).toEqual(['cookie', 'passport']);
    await appStore.set('p1', data!);
    expect(Object.keys(JSON.parse((await app('sessions').where({ sid: 'p1' }).first()).sess as string) as object).sort()).toEqual(['cookie', 'passport']);
  });

  it('comes with the organisation’s order-book version as it is at that read', async () => {
    await appStore.set('p5', session(userId));
    const orgId = (await app('users').where({ id: userId }).first('organisation_id')).organisation_id as number;
    const first = (await request('p5')).req.signedIn!;
    expect(first.bookVersion).toBe(0);
    await app('order_book_versions').insert({ organisation_id: orgId, version: 7 });
    const second = (await request('p5')).req.signedIn!;
    expect(second.bookVersion).toBe(7);
    expect(first.bookVersion).toBe(0);
  });

  it('sees a role change and a removal at the next request', async () => {
    await appStore.set('p2', session(userId));
    await app('users').where({ id: userId }).update({ role: 'merchant_owner' });
    expect((await request('p2')).req.signedIn?.user?.role).toBe('merchant_owner');
    await app('users').where({ id: userId }).delete();
    expect((await request('p2')).req.signedIn).toEqual({ id: userId, user: null, bookVersion: 0 });
  });

  it('carries the expiry the table holds, however long ago the session itself was saved', async () => {
    await appStore.set('p6', session(userId, DAY));
    const later = new Date(Date.now() + 7 * DAY);
    await appStore.moveExpiry('p6', later);
    const { req, data } = await request('p6');
    expect((data!.cookie.expires as Date).getTime()).toBe(later.getTime());
    expect(req.session!.cookie.expires!.getTime()).toBe(later.getTime());
  });

  it('is not there for a request whose session signs nobody in', async () => {
    await appStore.set('p3', { cookie: session(1).cookie } as SessionData);
    expect((await request('p3')).req.signedIn).toBeUndefined();
  });
});
