import pino from 'pino';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { placeOrderBodySchema } from '../../shared/schemas/order.schema';
import { createDb, type Db } from '../../server/db/knex';
import type { Mailer, MailMessage } from '../../server/mail/mailer';
import { enqueueMail, outboxHealth, type OutboxRow } from '../../server/mail/outbox';
import { claimDue, createMailWorker, retryDelayMs } from '../../server/mail/outbox-worker';
import { renderEmail } from '../../server/mail/templates';
import { usersRepository } from '../../server/modules/members/users.repository';
import { ordersService } from '../../server/modules/orders/orders.service';
import { contractorWithEstimate, merchantWithCatalogue, orderBody } from '../setup/order-scenario';
import { Client, createTestApp, type TestApp } from '../setup/test-app';

// The app's own worker is off: each test decides when mail is sent.
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ MAIL_WORKER: 'off', LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const silent = pino({ level: 'silent' });
const rows = (where: Partial<OutboxRow> = {}) => t.db<OutboxRow>('mail_outbox').where(where).orderBy('id');
const letter = (to: string, n = 0) => renderEmail({ to, subject: `Outbox letter ${n}`, heading: 'A letter', paragraphs: [`Number ${n}.`] });

describe('the mail outbox', () => {
  it("writes an order's e-mails in the order's transaction: committed they are queued, rolled back there are none", async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    const before = (await rows()).length;
    const placed = await k.c.post('/api/orders', orderBody(k, m));
    expect(placed.status, JSON.stringify(placed.body)).toBe(201);
    // Committed with the order, before any worker ran: the contractor and the desk's two people.
    const queued = (await rows()).slice(before);
    expect(queued.map((r) => [r.recipient, r.status])).toEqual(
      expect.arrayContaining([
        [k.email, 'queued'],
        [m.ownerEmail, 'queued'],
        [m.salesEmail, 'queued'],
      ]),
    );
    expect(queued).toHaveLength(3);
    for (const r of queued) expect(r.message_id).toMatch(/^<[0-9a-f-]{36}@ridgeload\.test>$/);
    expect(new Set(queued.map((r) => r.message_id)).size).toBe(3);

    // The same step inside a transaction that then rolls back: no order and no mail, before or after a drain.
    const user = (await usersRepository(t.db).findAuthUser(k.userId))!;
    const orderCount = Number((await t.db('orders').count({ n: '*' }).first())!.n);
    const failed = t.db.transaction(async (trx) => {
      const orders = ordersService({ config: t.config, db: trx, mailer: t.mail.mailer, logger: silent });
      await orders.place(user, placeOrderBodySchema.parse(orderBody(k, m, { po_reference: 'PO-ROLLED-BACK' })));
      expect((await trx('mail_outbox').count({ n: '*' }).first())!.n).toEqual(before + 6);
      throw new Error('the step failed after its e-mails were written');
    });
    await expect(failed).rejects.toThrow(/failed after/);
    expect(Number((await t.db('orders').count({ n: '*' }).first())!.n)).toBe(orderCount);
    expect(await rows()).toHaveLength(before + 3);
    await t.drainOutbox();
    expect(t.mail.messages.filter((x) => x.to.includes(k.email) && /sent to/.test(x.subject))).toHaveLength(1);
  });

  it('sends each queued row once, with its Message-ID, and marks it sent', async () => {
    const addresses = Array.from({ length: 12 }, (_, i) => `once.${i}@outbox.test`);
    await t.db.transaction(async (trx) => {
      for (const [i, a] of addresses.entries()) await enqueueMail(trx, letter(a, i), 'ridgeload.test');
    });
    const queued = await t.db<OutboxRow>('mail_outbox').whereIn('recipient', addresses).orderBy('id');
    expect(queued.map((r) => r.status)).toEqual(addresses.map(() => 'queued'));
    await t.drainOutbox();
    await t.drainOutbox();
    const sent = t.mail.messages.filter((x) => addresses.some((a) => x.to.includes(a)));
    expect(sent.map((x) => x.messageId).sort()).toEqual(queued.map((r) => r.message_id).sort());
    const after = await t.db<OutboxRow>('mail_outbox').whereIn('recipient', addresses).orderBy('id');
    for (const r of after) expect(r).toMatchObject({ status: 'sent', attempts: 1, last_error: null, sent_at: expect.any(String) });
    expect(await outboxHealth(t.db)).toMatchObject({ queued: 0, sending: 0, oldest_queued_age_s: null });
  });

  it('retries a failed send with exponential backoff and marks it failed after the last attempt', async () => {
    const calls: MailMessage[] = [];
    const refusing: Mailer = {
      async send(message) {
        calls.push(message);
        throw new Error('451 the mail server is resting');
      },
      close() {},
    };
    const worker = createMailWorker({ db: t.db, mailer: refusing, logger: silent }, { baseDelayMs: 60_000, maxDelayMs: 150_000, maxAttempts: 4 });
    await t.db.transaction((trx) => enqueueMail(trx, letter('refused@outbox.test'), 'ridgeload.test'));
    const [row] = await rows({ recipient: 'refused@outbox.test' });
    const waits: number[] = [];
    for (let attempt = 1; attempt <= 4; attempt++) {
      const started = Date.now();
      expect(await worker.runOnce()).toBe(1);
      const r = (await rows({ id: row!.id }))[0]!;
      expect(r.attempts).toBe(attempt);
      expect(r.last_error).toMatch(/451 the mail server is resting/);
      if (attempt < 4) {
        expect(r.status).toBe('queued');
        waits.push(Date.parse(r.next_attempt_at) - started);
        // Not due yet: the backoff holds it back.
        expect(await worker.runOnce()).toBe(0);
        // Time passes: make it due.
        await t
          .db('mail_outbox')
          .where({ id: r.id })
          .update({ next_attempt_at: new Date(Date.now() - 1).toISOString() });
      } else {
        expect(r.status).toBe('failed');
      }
    }
    // 60 s, 120 s, then capped at 150 s (each measured from just before its attempt).
    expect(waits.map((w) => Math.round(w / 1000))).toEqual([60, 120, 150]);
    expect(await worker.runOnce()).toBe(0);
    // Every attempt was the same message.
    expect(new Set(calls.map((c) => c.messageId))).toEqual(new Set([row!.message_id]));
    expect(calls).toHaveLength(4);
    expect(await outboxHealth(t.db)).toMatchObject({ failed: 1 });
    const health = await new Client(t.app).get('/api/health');
    expect(health.body).toMatchObject({ ok: true, mail: { failed: 1 } });
    expect(retryDelayMs(1, { baseDelayMs: 30_000, maxDelayMs: 3_600_000 })).toBe(30_000);
    expect(retryDelayMs(5, { baseDelayMs: 30_000, maxDelayMs: 3_600_000 })).toBe(480_000);
    expect(retryDelayMs(20, { baseDelayMs: 30_000, maxDelayMs: 3_600_000 })).toBe(3_600_000);
  });

  it('sends a message that failed once on its next attempt, with the same Message-ID', async () => {
    let refuse = true;
    const flaky: Mailer = {
      async send(message) {
        if (refuse) {
          refuse = false;
          throw new Error('421 try again later');
        }
        await t.mail.mailer.send(message);
      },
      close() {},
    };
    const worker = createMailWorker({ db: t.db, mailer: flaky, logger: silent }, { baseDelayMs: 1 });
    await t.db.transaction((trx) => enqueueMail(trx, letter('flaky@outbox.test'), 'ridgeload.test'));
    await worker.runOnce();
    await new Promise((r) => setTimeout(r, 5));
    await worker.drain();
    const [r] = await rows({ recipient: 'flaky@outbox.test' });
    expect(r).toMatchObject({ status: 'sent', attempts: 2 });
    expect(t.mail.messages.filter((x) => x.to.includes('flaky@outbox.test')).map((x) => x.messageId)).toEqual([r!.message_id]);
  });

  it('reports the queue depth and the age of the oldest waiting message on the health check', async () => {
    const old = new Date(Date.now() - 90_000).toISOString();
    await t.db.transaction((trx) => enqueueMail(trx, letter('waiting@outbox.test'), 'ridgeload.test'));
    await t.db('mail_outbox').where({ recipient: 'waiting@outbox.test' }).update({ created_at: old });
    const res = await new Client(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.mail.queued).toBe(1);
    expect(res.body.mail.oldest_queued_age_s).toBeGreaterThanOrEqual(90);
    expect(res.body.mail.oldest_queued_age_s).toBeLessThan(120);
    await t.drainOutbox();
    expect((await new Client(t.app).get('/api/health')).body.mail).toMatchObject({ queued: 0, oldest_queued_age_s: null });
  });
});

describe('claiming', () => {
  let other: Db;
  beforeAll(() => {
    // A second connection pool on the same database, as a second process would have.
    other = createDb(t.config.database);
  });
  afterAll(async () => other.destroy());

  it('never gives one row to two claimers running at once', async () => {
    const addresses = Array.from({ length: 120 }, (_, i) => `claim.${i}@outbox.test`);
    await t.db.transaction(async (trx) => {
      for (const [i, a] of addresses.entries()) await enqueueMail(trx, letter(a, i), 'ridgeload.test');
    });
    const ids = (await t.db('mail_outbox').whereIn('recipient', addresses).pluck('id')) as number[];
    const claimer = async (db: Db, name: string) => {
      const got: number[] = [];
      for (;;) {
        const claimed = await claimDue(db, name, 3, 120_000);
        if (claimed.length === 0) return got;
        for (const r of claimed) expect(r).toMatchObject({ status: 'sending', claimed_by: name, attempts: 1 });
        got.push(...claimed.map((r) => r.id));
      }
    };
    // Both connections open before the race, so the second server is not still connecting when the first has claimed everything.
    await Promise.all([t.db.raw('select 1'), other.raw('select 1')]);
    const [a, b, c] = await Promise.all([claimer(t.db, 'worker-a'), claimer(other, 'worker-b'), claimer(t.db, 'worker-c')]);
    const all = [...a!, ...b!, ...c!];
    expect(all.filter((id) => ids.includes(id)).sort((x, y) => x - y)).toEqual([...ids].sort((x, y) => x - y));
    expect(new Set(all).size).toBe(all.length);
    expect(b!.length).toBeGreaterThan(0);
    // Release them for the tests after.
    await t.db('mail_outbox').whereIn('id', ids).update({ status: 'sent', sent_at: new Date().toISOString() });
  });

  it('claims a row left sending past its lease again (its worker died) and sends it with the same Message-ID', async () => {
    await t.db.transaction(async (trx) => {
      await enqueueMail(trx, letter('stuck@outbox.test'), 'ridgeload.test');
      await enqueueMail(trx, letter('busy@outbox.test'), 'ridgeload.test');
    });
    const [stuck] = await claimDue(t.db, 'worker-that-dies', 1, 120_000);
    const [busy] = await claimDue(t.db, 'worker-still-sending', 1, 120_000);
    expect([stuck!.recipient, busy!.recipient]).toEqual(['stuck@outbox.test', 'busy@outbox.test']);
    // Within the lease neither is claimable.
    expect(await claimDue(other, 'worker-b', 10, 120_000)).toEqual([]);
    // Three minutes on, the first claim's lease has run out; the second is still held.
    await t
      .db('mail_outbox')
      .where({ id: stuck!.id })
      .update({ claimed_at: new Date(Date.now() - 180_000).toISOString() });
    const again = await claimDue(other, 'worker-b', 10, 120_000);
    expect(again.map((r) => [r.id, r.claimed_by, r.attempts])).toEqual([[stuck!.id, 'worker-b', 2]]);
    await t
      .db('mail_outbox')
      .where({ id: stuck!.id })
      .update({ claimed_at: new Date(Date.now() - 180_000).toISOString() });
    await t.drainOutbox();
    const [done] = await rows({ id: stuck!.id });
    expect(done).toMatchObject({ status: 'sent', message_id: stuck!.message_id });
    expect(t.mail.messages.filter((x) => x.to.includes('stuck@outbox.test')).map((x) => x.messageId)).toEqual([stuck!.message_id]);
    await t.db('mail_outbox').where({ id: busy!.id }).update({ status: 'sent' });
  });
});
