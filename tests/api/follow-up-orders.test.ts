import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays, addMonths } from '../../shared/domain/business-calendar';
import { orderDetailSchema } from '../../shared/schemas/order.schema';
import { createTestApp, type TestApp } from '../setup/test-app';
import { contractorWithEstimate, merchantWithCatalogue, orderBody, type TestMerchant } from '../setup/order-scenario';
import { inDays, signIn } from '../setup/scenario';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const TILE = 'TRS-FL420-SG';
type Detail = ReturnType<typeof orderDetailSchema.parse>;

async function mailTo(address: string, subject: RegExp) {
  for (let i = 0; i < 50; i++) {
    const found = t.mail.messages.find((m) => m.to.includes(address) && subject.test(m.subject));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no e-mail to ${address} matching ${subject}`);
}

/** An order confirmed with the tile line part-sent: `sendNow` packs now, the rest back-ordered. */
async function partConfirmed(m: TestMerchant, sendNow = 2) {
  const k = await contractorWithEstimate(t, m);
  const placed = orderDetailSchema.parse((await k.c.post('/api/orders', orderBody(k, m, { po_reference: 'PO-FOLLOW' }))).body);
  const tile = placed.lines.find((l) => l.sku === TILE)!;
  const desk = await signIn(t.app, m.salesEmail);
  const confirmed = await desk.post(`/api/orders/${placed.id}/confirm`, { lines: [{ line_id: tile.id, quantity: sendNow }] });
  expect(confirmed.status).toBe(200);
  return { k, desk, order: orderDetailSchema.parse((await desk.get(`/api/orders/${placed.id}`)).body), tile };
}

describe('back-ordered packs follow as an order of their own', () => {
  it('carries exactly the back-ordered packs at the agreed prices, for the desk to confirm against stock later', async () => {
    const m = await merchantWithCatalogue(t);
    const { k, desk, order, tile } = await partConfirmed(m);
    const owed = tile.quantity - 2;
    expect(order.back_ordered_packs).toBe(owed);
    expect(order.allowed_actions).toContain('start_follow_up');
    const heldBefore = (
      await t
        .db('branch_products')
        .where({ branch_id: m.branchId, product_id: m.product(TILE) })
        .first()
    ).reserved;

    const res = await desk.post(`/api/orders/${order.id}/follow-up`, { requested_date: inDays(14), time_window: '08:00-12:00', note: 'Second tile run from the works' });
    expect(res.status).toBe(201);
    const follow = orderDetailSchema.parse(res.body);
    expect(follow.status).toBe('agreed');
    expect(follow.follows).toMatchObject({ id: order.id, reference: order.reference });
    expect(follow.lines).toHaveLength(1);
    expect(follow.lines[0]).toMatchObject({ sku: TILE, quantity: owed, unit_price: tile.unit_price, total: owed * tile.unit_price, reserved_quantity: 0 });
    expect(follow.subtotal).toBe(owed * tile.unit_price);
    expect(follow.requested_date).toBe(inDays(14));
    expect(follow.po_reference).toBe('PO-FOLLOW');
    expect(follow.site).toEqual(order.site);
    // Nothing is held from stock until the desk confirms the follow-up.
    expect(
      (
        await t
          .db('branch_products')
          .where({ branch_id: m.branchId, product_id: m.product(TILE) })
          .first()
      ).reserved,
    ).toBe(heldBefore);

    const first = orderDetailSchema.parse((await desk.get(`/api/orders/${order.id}`)).body);
    expect(first.followed_by).toMatchObject({ id: follow.id, reference: follow.reference });
    expect(first.allowed_actions).not.toContain('start_follow_up');
    expect(first.timeline.at(-1)?.summary).toContain(follow.reference);

    // The contractor sees both ends and hears of it.
    const seen = orderDetailSchema.parse((await k.c.get(`/api/orders/${follow.id}`)).body);
    expect(seen.follows?.reference).toBe(order.reference);
    const mail = await mailTo(k.email, new RegExp(`Back-ordered packs follow as order ${follow.reference}`));
    expect(mail.text).toContain(order.reference);
    expect(mail.text).toContain('Second tile run from the works');

    // The desk confirms it like any order, which now holds the stock.
    const confirmed = await desk.post(`/api/orders/${follow.id}/confirm`, {});
    expect(confirmed.status).toBe(200);
    expect(
      (
        await t
          .db('branch_products')
          .where({ branch_id: m.branchId, product_id: m.product(TILE) })
          .first()
      ).reserved,
    ).toBe(heldBefore + owed);
  });

  it('starts one follow-up per order, however often it is asked', async () => {
    const m = await merchantWithCatalogue(t);
    const { desk, order } = await partConfirmed(m);
    const answers = await Promise.all([1, 2, 3].map(() => desk.post(`/api/orders/${order.id}/follow-up`, { requested_date: inDays(10) })));
    expect(answers.map((a) => a.status).sort()).toEqual([201, 409, 409]);
    const refused = answers.find((a) => a.status === 409)!;
    expect(refused.body.error.code).toBe('follow_up_exists');
    expect(await t.db('orders').where({ follows_order_id: order.id }).count({ n: '*' }).first()).toEqual({ n: 1 });
  });

  it('lets the packs be sent on again once a follow-up is cancelled by the contractor', async () => {
    const m = await merchantWithCatalogue(t);
    const { k, desk, order } = await partConfirmed(m);
    const first = (await desk.post(`/api/orders/${order.id}/follow-up`, { requested_date: inDays(10) })).body as { id: number };
    expect((await k.c.post(`/api/orders/${first.id}/cancel`, { reason: 'Hips bought elsewhere for this plot' })).status).toBe(200);
    const after = orderDetailSchema.parse((await desk.get(`/api/orders/${order.id}`)).body);
    expect(after.followed_by).toBeNull();
    expect(after.allowed_actions).toContain('start_follow_up');
    const again = await desk.post(`/api/orders/${order.id}/follow-up`, { requested_date: inDays(12) });
    expect(again.status).toBe(201);
    expect(again.body.id).not.toBe(first.id);
  });

  it('refuses an order with nothing back-ordered, one not yet confirmed, a past day, and anyone but the desk', async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    const desk = await signIn(t.app, m.salesEmail);
    const sent = orderDetailSchema.parse((await k.c.post('/api/orders', orderBody(k, m))).body);
    const notYet = await desk.post(`/api/orders/${sent.id}/follow-up`, { requested_date: inDays(10) });
    expect(notYet.status).toBe(409);
    expect(notYet.body.error.code).toBe('order_not_confirmed');

    expect((await desk.post(`/api/orders/${sent.id}/confirm`, {})).status).toBe(200);
    const nothing = await desk.post(`/api/orders/${sent.id}/follow-up`, { requested_date: inDays(10) });
    expect(nothing.status).toBe(409);
    expect(nothing.body.error.code).toBe('nothing_back_ordered');

    const { order, k: owner } = await partConfirmed(m);
    const past = await desk.post(`/api/orders/${order.id}/follow-up`, { requested_date: inDays(-1) });
    expect(past.status).toBe(422);
    expect(past.body.error.details[0].path).toBe('requested_date');
    const badDate = await desk.post(`/api/orders/${order.id}/follow-up`, { requested_date: '2027-02-30' });
    expect(badDate.status).toBe(422);
    for (const tooFar of ['9999-12-31', addDays(addMonths(t.config.calendar.today(), 24), 1)]) {
      const far = await desk.post(`/api/orders/${order.id}/follow-up`, { requested_date: tooFar });
      expect(far.status).toBe(422);
      expect(far.body.error.details[0]).toMatchObject({ path: 'requested_date', message: expect.stringMatching(/within two years/) });
    }

    expect((await owner.c.post(`/api/orders/${order.id}/follow-up`, { requested_date: inDays(10) })).status).toBe(403);
    const other = await merchantWithCatalogue(t);
    const otherDesk = await signIn(t.app, other.salesEmail);
    expect((await otherDesk.post(`/api/orders/${order.id}/follow-up`, { requested_date: inDays(10) })).status).toBe(404);
    const yard = await signIn(t.app, m.dispatcherEmail);
    expect((await yard.post(`/api/orders/${order.id}/follow-up`, { requested_date: inDays(10) })).status).toBe(403);
    expect(await t.db('orders').where({ follows_order_id: order.id }).first()).toBeUndefined();
  });
});

describe('comments reach the other side by e-mail', () => {
  it("mails the desk a contractor's comment and the contractor a desk's comment, never the writer", async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    const order = orderDetailSchema.parse((await k.c.post('/api/orders', orderBody(k, m))).body) as Detail;
    const desk = await signIn(t.app, m.salesEmail);

    expect((await k.c.post(`/api/orders/${order.id}/comments`, { body: 'Can the crane set the pallets on the scaffold at plot 3?' })).status).toBe(201);
    const toDesk = await mailTo(m.salesEmail, new RegExp(`commented on order ${order.reference}`));
    expect(toDesk.text).toContain('Can the crane set the pallets on the scaffold at plot 3?');

    expect((await desk.post(`/api/orders/${order.id}/comments`, { body: 'Yes, within the lift limit of the crane; the driver decides on site.' })).status).toBe(201);
    const toContractor = await mailTo(k.email, new RegExp(`commented on order ${order.reference}`));
    expect(toContractor.text).toContain('the driver decides on site');

    const comments = t.mail.messages.filter((x) => /commented on order/.test(x.subject) && x.subject.includes(order.reference));
    expect(comments.filter((x) => x.to.includes(k.email))).toHaveLength(1);
    expect(comments.filter((x) => x.to.includes(m.salesEmail))).toHaveLength(1);
  });
});
