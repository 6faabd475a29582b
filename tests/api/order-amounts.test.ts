import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { orderDetailSchema } from '../../shared/schemas/order.schema';
import { createTestApp, type TestApp } from '../setup/test-app';
import { contractorWithEstimate, merchantWithCatalogue, orderBody } from '../setup/order-scenario';
import { inDays, signIn } from '../setup/scenario';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const TILE = 'TRS-FL420-SG';

describe('an order shows what comes now, what follows and what was dropped, priced, on both sides', () => {
  it('after a part-confirmation the amount agreed now is what the invoice charges, and the rest is priced as to follow', async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    const placed = orderDetailSchema.parse((await k.c.post('/api/orders', orderBody(k, m))).body);
    const tile = placed.lines.find((l) => l.sku === TILE)!;
    const asked = placed.lines.reduce((s, l) => s + l.quantity * l.unit_price, 0);
    // Before the desk answers, everything asked for is what would come.
    expect(placed.amounts).toEqual({ agreed_now_minor: asked, to_follow_minor: 0, dropped_minor: 0 });

    const desk = await signIn(t.app, m.salesEmail);
    expect((await desk.post(`/api/orders/${placed.id}/confirm`, { lines: [{ line_id: tile.id, quantity: tile.quantity - 3 }] })).status).toBe(200);

    const owed = 3 * tile.unit_price;
    for (const side of [desk, k.c]) {
      const order = orderDetailSchema.parse((await side.get(`/api/orders/${placed.id}`)).body);
      expect(order.amounts).toEqual({ agreed_now_minor: asked - owed, to_follow_minor: owed, dropped_minor: 0 });
      const line = order.lines.find((l) => l.id === tile.id)!;
      expect(line).toMatchObject({ now_quantity: tile.quantity - 3, now_total: (tile.quantity - 3) * tile.unit_price, to_follow_total: owed, dropped_quantity: 0, dropped_total: 0 });
      expect(order.lines.reduce((s, l) => s + l.now_total, 0)).toBe(order.amounts.agreed_now_minor);
    }

    const owner = await signIn(t.app, m.ownerEmail);
    const invoice = await owner.post(`/api/orders/${placed.id}/invoice`, {});
    expect(invoice.status, JSON.stringify(invoice.body)).toBe(201);
    expect(invoice.body.subtotal).toBe(asked - owed);

    // Once the follow-up order is started, the packs to follow name it on both sides.
    const follow = await desk.post(`/api/orders/${placed.id}/follow-up`, { requested_date: inDays(14) });
    expect(follow.status).toBe(201);
    const seen = orderDetailSchema.parse((await k.c.get(`/api/orders/${placed.id}`)).body);
    expect(seen.followed_by?.id).toBe(follow.body.id);
    expect(orderDetailSchema.parse(follow.body).amounts.agreed_now_minor).toBe(owed);
  });

  it('prices the packs the desk cannot send and does not back-order as dropped, not as coming', async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    const placed = orderDetailSchema.parse((await k.c.post('/api/orders', orderBody(k, m))).body);
    const tile = placed.lines.find((l) => l.sku === TILE)!;
    const desk = await signIn(t.app, m.salesEmail);
    const offered = await desk.post(`/api/orders/${placed.id}/proposals`, {
      revision: placed.revision,
      lines: [{ line_id: tile.id, confirmed_quantity: tile.quantity - 5, back_order_quantity: 2 }],
    });
    expect(offered.status, JSON.stringify(offered.body)).toBe(201);
    const accepted = await k.c.post(`/api/orders/${placed.id}/proposals/${offered.body.proposal_id}/accept`, {});
    expect(accepted.status).toBe(200);
    const asked = placed.lines.reduce((s, l) => s + l.quantity * l.unit_price, 0);
    const order = orderDetailSchema.parse(accepted.body);
    expect(order.amounts).toEqual({ agreed_now_minor: asked - 5 * tile.unit_price, to_follow_minor: 2 * tile.unit_price, dropped_minor: 3 * tile.unit_price });
    expect(order.lines.find((l) => l.id === tile.id)).toMatchObject({ dropped_quantity: 3, dropped_total: 3 * tile.unit_price });

    // The desk then confirms what was agreed: the invoice for it charges exactly the amount agreed now.
    expect((await desk.post(`/api/orders/${placed.id}/confirm`, {})).status).toBe(200);
    const confirmed = orderDetailSchema.parse((await desk.get(`/api/orders/${placed.id}`)).body);
    const invoice = await (await signIn(t.app, m.ownerEmail)).post(`/api/orders/${placed.id}/invoice`, {});
    expect(invoice.body.subtotal).toBe(confirmed.amounts.agreed_now_minor);
  });
});
