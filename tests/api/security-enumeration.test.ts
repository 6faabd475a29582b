import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, createTestApp, type TestApp } from '../setup/test-app';
import { makeOrgWithUser, makeUser, TEST_PASSWORD } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ RESET_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const TRIES = 20;
const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return (s[(s.length - 1) >> 1]! + s[s.length >> 1]!) / 2;
};
const settle = () => new Promise((r) => setTimeout(r, 15));

/** Times one request in milliseconds and hands back its answer. */
async function timed<T>(send: () => Promise<T>): Promise<{ ms: number; res: T }> {
  const start = performance.now();
  const res = await send();
  return { ms: performance.now() - start, res };
}

describe('a reset request does not tell who has an account', () => {
  it(`answers a known and an unknown address alike, in content and in time (medians of ${TRIES} tries within 10 ms)`, async () => {
    const known = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator');
    const c = new Client(t.app);
    await c.csrf();
    // A busy machine (the whole suite runs in parallel) can swamp one round of twenty with noise;
    // a real difference (an awaited e-mail costs about 100 ms) shows in every round, so up to three are run.
    const rounds: string[] = [];
    let resets = 0;
    for (let round = 0; round < 3; round++) {
      const knownMs: number[] = [];
      const unknownMs: number[] = [];
      for (let i = 0; i < TRIES; i++) {
        const pair = [
          [known.email, knownMs],
          [`nobody.${round}.${i}@nowhere.test`, unknownMs],
        ] as const;
        // Alternate which goes first, and let the known address's mail go out before the next try,
        // so work done after one answer never lands on the other kind's clock.
        for (const [email, into] of i % 2 === 0 ? pair : [...pair].reverse()) {
          const mails = t.mail.messages.length;
          const { ms, res } = await timed(() => c.post('/api/auth/password/forgot', { email }));
          expect(res.status).toBe(202);
          expect(res.body).toEqual({ ok: true });
          expect(res.headers['content-length']).toBe('11');
          into.push(ms);
          if (email === known.email) {
            resets++;
            await expect.poll(() => t.mail.messages.length, { timeout: 5000, interval: 5 }).toBe(mails + 1);
          }
          await settle();
        }
      }
      const diff = Math.abs(median(knownMs) - median(unknownMs));
      rounds.push(`known ${median(knownMs).toFixed(1)} ms, unknown ${median(unknownMs).toFixed(1)} ms`);
      if (diff < 10) break;
    }
    expect(rounds.length, rounds.join('; ')).toBeLessThan(4);
    const last = rounds[rounds.length - 1]!.match(/[\d.]+/g)!.map(Number);
    expect(Math.abs(last[0]! - last[1]!), rounds.join('; ')).toBeLessThan(10);
    // The known address still gets its link, after the answer.
    await t.mail.waitFor(known.email);
    await expect.poll(async () => (await t.db('password_resets').where({ user_id: known.userId })).length).toBe(resets);
  });
});

describe('an invitation does not tell who has an account', () => {
  it('answers an address registered with another firm exactly like a new one, changes no one’s firm and tells that person by e-mail', async () => {
    const owner = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner', 'Cobbleford Tiles');
    const elsewhere = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
    const c = new Client(t.app);
    expect((await c.login(owner.email, TEST_PASSWORD)).status).toBe(200);

    const taken = await c.post('/api/invitations', { email: elsewhere.email, role: 'merchant_sales' });
    const fresh = await c.post('/api/invitations', { email: 'brand.new@cobbleford.test', role: 'merchant_sales' });
    expect(taken.status).toBe(201);
    expect(fresh.status).toBe(201);
    const shape = (b: Record<string, unknown>) => ({ ...b, id: 0, email: '', expires_at: '', created_at: '' });
    expect(shape(taken.body)).toEqual(shape(fresh.body));
    expect(Object.keys(taken.body).sort()).toEqual(Object.keys(fresh.body).sort());

    const user = await t.db('users').where({ id: elsewhere.userId }).first();
    expect(user.organisation_id).toBe(elsewhere.organisationId);
    expect(user.role).toBe('contractor_owner');

    const mail = await t.mail.waitFor(elsewhere.email);
    expect(mail.text).toMatch(/already in use with another firm/);
    expect(mail.text).not.toMatch(/\/invitations\//);
    const invite = await t.mail.waitFor('brand.new@cobbleford.test');
    expect(invite.text).toMatch(/\/invitations\/[A-Za-z0-9_-]{20,}/);
  });

  it(`answers invitations to taken and new addresses in the same time (medians of ${TRIES} tries within 10 ms)`, async () => {
    const owner = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
    const other = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
    const taken: string[] = [];
    for (let i = 0; i < TRIES; i++) taken.push((await makeUser(t.db, other.organisationId, 'contractor_estimator')).email);
    const c = new Client(t.app);
    expect((await c.login(owner.email, TEST_PASSWORD)).status).toBe(200);
    const rounds: string[] = [];
    let used = 0;
    for (let round = 0; round < 3; round++) {
      const takenMs: number[] = [];
      const freshMs: number[] = [];
      for (let i = 0; i < TRIES; i++) {
        const pair = [
          [taken[used++ % taken.length]!, takenMs],
          [`new.${round}.${i}@timing.test`, freshMs],
        ] as const;
        for (const [email, into] of i % 2 === 0 ? pair : [...pair].reverse()) {
          const mails = t.mail.messages.length;
          const { ms, res } = await timed(() => c.post('/api/invitations', { email, role: 'contractor_estimator' }));
          expect(res.status).toBe(201);
          into.push(ms);
          await expect.poll(() => t.mail.messages.length, { timeout: 5000, interval: 5 }).toBe(mails + 1);
          await settle();
        }
      }
      const diff = Math.abs(median(takenMs) - median(freshMs));
      rounds.push(`taken ${median(takenMs).toFixed(1)} ms, new ${median(freshMs).toFixed(1)} ms`);
      if (diff < 10) break;
    }
    const last = rounds[rounds.length - 1]!.match(/[\d.]+/g)!.map(Number);
    expect(Math.abs(last[0]! - last[1]!), rounds.join('; ')).toBeLessThan(10);
  });
});
