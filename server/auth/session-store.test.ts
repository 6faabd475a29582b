import type { SessionData } from 'express-session';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../db/knex';
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

  it('moves a far-off stored expiry at most every few minutes, and a near one at once', async () => {
    await store.set('g', session(17, 7 * DAY));
    const firstExpiry = (await stored('g'))!.expired;
    await store.touch('g', session(17, 7 * DAY + 1000));
    expect((await stored('g'))!.expired).toBe(firstExpiry);
    await store.set('g2', session(18, 40));
    await store.touch('g2', session(18, DAY));
    await new Promise((r) => setTimeout(r, 80));
    expect((await get('g2'))?.passport).toEqual({ user: 18 });
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
