import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, kindOfRole } from '../../shared/domain/roles';
import { orderDetailSchema, orderListSchema } from '../../shared/schemas/order.schema';
import { DEMO_CATALOGUES } from '../../seeds/02-catalogue';
import { createTestApp, type TestApp } from '../setup/test-app';
import { inDays, signIn } from '../setup/scenario';
import { contractorWithEstimate as sharedContractor, mailTo as sharedMailTo, merchantWithCatalogue, orderBody, type TestMerchant } from '../setup/order-scenario';
import { makeOrgWithUser } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const [TOLLERBECK, CADDONMERE] = DEMO_CATALOGUES;

const login = (email: string) => signIn(t.app, email);

const merchant = (catalogue = TOLLERBECK) => merchantWithCatalogue(t, catalogue);
type Merchant = TestMerchant;
const contractorWithEstimate = (m: Merchant, access: Record<string, string> = {}) => sharedContractor(t, m, access);

const stockOf = (m: Merchant, sku: string) =>
  t
    .db('branch_products')
    .where({ branch_id: m.branchId, product_id: m.product(sku) })
    .first();
const tileLine = (o: { lines: { sku: string }[] }) => o.lines.find((l) => l.sku === 'TRS-FL420-SG') as { id: number; quantity: number; sku: string };

const mailTo = (address: string, subject: RegExp) => sharedMailTo(t, address, subject);

describe('confirming an order against stock', () => {
  it('reserves every line in full, marks the order confirmed and tells the contractor', async () => {
    const m = await merchant();
    const k = await contractorWithEstimate(m);
    const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const before = await stockOf(m, 'TRS-FL420-SG');
    const desk = await login(m.salesEmail);
    const res = await desk.post(`/api/orders/${order.id}/confirm`, {});
    expect(res.status).toBe(200);
    const o = orderDetailSchema.parse(res.body);
    expect(o.status).toBe('confirmed');
    expect(o.confirmed_at).not.toBeNull();
    for (const l of o.lines) expect(l).toMatchObject({ confirmed_quantity: l.quantity, reserved_quantity: l.quantity, back_order_quantity: 0, status: 'agreed' });
    const tiles = tileLine(o);
    const after = await stockOf(m, 'TRS-FL420-SG');
    expect(after.reserved - before.reserved).toBe(tiles.quantity);
    expect(after.on_hand).toBe(before.on_hand);
    expect(o.timeline.at(-1)).toMatchObject({ kind: 'confirmed' });
    expect((await mailTo(k.email, /confirmed/)).text).toMatch(/holds the stock/);
    // Confirming twice is refused and holds nothing more.
    const again = await desk.post(`/api/orders/${order.id}/confirm`, {});
    expect(again.status).toBe(409);
    expect((await stockOf(m, 'TRS-FL420-SG')).reserved).toBe(after.reserved);
  });

  it('refuses with 409 insufficient_stock naming SKU, packs free and packs asked, and holds nothing', async () => {
    const m = await merchant();
    const k = await contractorWithEstimate(m);
    const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const tiles = tileLine(order);
    await t
      .db('branch_products')
      .where({ branch_id: m.branchId, product_id: m.product('TRS-FL420-SG') })
      .update({ on_hand: 100, reserved: 40 });
    const reservedBefore = await t.db('branch_products').where({ branch_id: m.branchId }).sum({ r: 'reserved' }).first();
    const desk = await login(m.ownerEmail);
    const res = await desk.post(`/api/orders/${order.id}/confirm`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('insufficient_stock');
    expect(res.body.error.details).toEqual([expect.objectContaining({ sku: 'TRS-FL420-SG', available: 60, requested: tiles.quantity })]);
    expect(await t.db('branch_products').where({ branch_id: m.branchId }).sum({ r: 'reserved' }).first()).toEqual(reservedBefore);
    expect((await t.db('orders').where({ id: order.id }).first()).status).toBe('sent');
    expect(await t.db('order_lines').where({ order_id: order.id }).sum({ r: 'reserved_quantity' }).first()).toEqual({ r: 0 });
  });

  it('confirms part of a line and back-orders the rest', async () => {
    const m = await merchant();
    const k = await contractorWithEstimate(m);
    const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const tiles = tileLine(order);
    const desk = await login(m.salesEmail);
    const res = await desk.post(`/api/orders/${order.id}/confirm`, { lines: [{ line_id: tiles.id, quantity: 100 }] });
    expect(res.status).toBe(200);
    const line = res.body.lines.find((l: { id: number }) => l.id === tiles.id);
    expect(line).toMatchObject({ confirmed_quantity: 100, back_order_quantity: tiles.quantity - 100, reserved_quantity: 100, status: 'part_agreed', total: tiles.quantity * 128 });
    expect(res.body.timeline.at(-1).summary).toMatch(new RegExp(`${tiles.quantity - 100} packs back-ordered`));
    const bad = await desk.post(`/api/orders/${(await k.c.post('/api/orders', orderBody(k, m))).body.id}/confirm`, { lines: [{ line_id: tiles.id, quantity: 5 }] });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details[0].path).toBe('lines.0.line_id');
  });

  it('confirms an order whose substitute the contractor accepted, reserving the substitute product', async () => {
    const m = await merchant();
    const k = await contractorWithEstimate(m);
    const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const ridge = order.lines.find((l: { sku: string }) => l.sku === 'TRS-RHR-SG');
    const desk = await login(m.salesEmail);
    const offer = await desk.post(`/api/orders/${order.id}/proposals`, {
      revision: 1,
      lines: [{ line_id: ridge.id, confirmed_quantity: 0, substitute: { product_id: m.product('TRS-RCL-BR'), quantity: ridge.quantity } }],
    });
    expect(offer.status).toBe(201);
    // The desk cannot confirm until the contractor answers the offer.
    expect((await desk.post(`/api/orders/${order.id}/confirm`, {})).status).toBe(409);
    expect((await k.c.post(`/api/orders/${order.id}/proposals/${offer.body.proposal_id}/accept`, {})).status).toBe(200);
    const before = await stockOf(m, 'TRS-RCL-BR');
    const res = await desk.post(`/api/orders/${order.id}/confirm`, {});
    expect(res.status).toBe(200);
    const sub = res.body.lines.find((l: { sku: string }) => l.sku === 'TRS-RCL-BR');
    expect(sub).toMatchObject({ status: 'substitute', reserved_quantity: ridge.quantity });
    expect(res.body.lines.find((l: { id: number }) => l.id === ridge.id)).toMatchObject({ reserved_quantity: 0, status: 'replaced' });
    expect((await stockOf(m, 'TRS-RCL-BR')).reserved - before.reserved).toBe(ridge.quantity);
  });

  it('a contractor can never confirm, and a dispatcher or driver neither', async () => {
    const m = await merchant();
    const k = await contractorWithEstimate(m);
    const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
    expect((await k.c.post(`/api/orders/${order.id}/confirm`, {})).status).toBe(403);
    expect((await (await login(m.dispatcherEmail)).post(`/api/orders/${order.id}/confirm`, {})).status).toBe(403);
    expect((await (await login(m.driverEmail)).post(`/api/orders/${order.id}/confirm`, {})).status).toBe(403);
    expect((await t.db('orders').where({ id: order.id }).first()).status).toBe('sent');
  });
});

describe('two dozen desks competing for the last pallets', () => {
  it('confirms only the orders the stock covers; the rest get 409 and nothing is half-reserved', async () => {
    const m = await merchant();
    const k = await contractorWithEstimate(m);
    const ORDERS = 24;
    const PER_ORDER = 180; // one pallet of 180 tiles each (common practice for this tile's pallet)
    const tileId = m.product('TRS-FL420-SG');
    const battenId = m.product('TRS-BAT-3825');
    const ids: number[] = [];
    for (let i = 0; i < ORDERS; i++) {
      const o = await k.c.post(
        '/api/orders',
        orderBody(k, m, {
          lines: [
            { product_id: tileId, quantity: PER_ORDER },
            { product_id: battenId, quantity: 10 },
          ],
        }),
      );
      ids.push(o.body.id);
    }
    // Stock for five orders' tiles and far more battens: only the tiles decide.
    await t
      .db('branch_products')
      .where({ branch_id: m.branchId, product_id: tileId })
      .update({ on_hand: 5 * PER_ORDER + 90, reserved: 0 });
    const desks = await Promise.all([m.salesEmail, m.ownerEmail].map(login));
    const results = await Promise.all(ids.map((id, i) => desks[i % 2].post(`/api/orders/${id}/confirm`, {})));
    const ok = results.filter((r) => r.status === 200);
    const refused = results.filter((r) => r.status === 409);
    expect(ok).toHaveLength(5);
    expect(refused).toHaveLength(ORDERS - 5);
    for (const r of refused) expect(r.body.error).toMatchObject({ code: 'insufficient_stock', details: [expect.objectContaining({ sku: 'TRS-FL420-SG', requested: PER_ORDER })] });
    const tile = await stockOf(m, 'TRS-FL420-SG');
    const batten = await stockOf(m, 'TRS-BAT-3825');
    expect(tile.on_hand - tile.reserved).toBeGreaterThanOrEqual(0);
    expect(tile.reserved).toBe(5 * PER_ORDER);
    expect(batten.reserved).toBe(5 * 10);
    const held = (await t.db('order_lines').whereIn('order_id', ids).select('product_id').sum({ r: 'reserved_quantity' }).groupBy('product_id')) as { product_id: number; r: number }[];
    expect(new Map(held.map((h) => [h.product_id, Number(h.r)]))).toEqual(
      new Map([
        [tileId, tile.reserved],
        [battenId, batten.reserved],
      ]),
    );
    const confirmed = await t.db('orders').whereIn('id', ids).where({ status: 'confirmed' }).pluck('id');
    expect(confirmed.sort()).toEqual(ok.map((r) => r.body.id).sort());
    const unconfirmedHolding = await t
      .db('order_lines')
      .whereIn(
        'order_id',
        ids.filter((id) => !confirmed.includes(id)),
      )
      .where('reserved_quantity', '>', 0)
      .first();
    expect(unconfirmedHolding).toBeUndefined();
  });
});

describe('the merchant order book', () => {
  it('lists only orders to the caller’s branches, filtered by stages, contractor and dates, sorted and paged', async () => {
    const m = await merchant();
    const k1 = await contractorWithEstimate(m);
    const k2 = await contractorWithEstimate(m);
    const rival = await merchant(CADDONMERE);
    const a = (await k1.c.post('/api/orders', orderBody(k1, m, { requested_date: inDays(3) }))).body;
    const b = (await k1.c.post('/api/orders', orderBody(k1, m, { requested_date: inDays(9) }))).body;
    const c = (await k2.c.post('/api/orders', orderBody(k2, m, { requested_date: inDays(5), po_reference: 'ROOF-77' }))).body;
    const desk = await login(m.salesEmail);
    await desk.post(`/api/orders/${a.id}/confirm`, {});

    const all = orderListSchema.parse((await desk.get('/api/orders?sort=requested_date&dir=asc')).body);
    expect(all.orders.map((o) => o.id)).toEqual([a.id, c.id, b.id]);
    expect((await desk.get('/api/orders?statuses=sent,agreed')).body.orders.map((o: { id: number }) => o.id).sort()).toEqual([b.id, c.id].sort());
    expect((await desk.get(`/api/orders?contractor_id=${k2.organisationId}`)).body.orders.map((o: { id: number }) => o.id)).toEqual([c.id]);
    expect((await desk.get(`/api/orders?date_from=${inDays(4)}&date_to=${inDays(6)}`)).body.orders.map((o: { id: number }) => o.id)).toEqual([c.id]);
    const today = new Date().toISOString().slice(0, 10);
    expect((await desk.get(`/api/orders?date_field=placed_at&date_from=${today}&date_to=${today}`)).body.total).toBe(3);
    expect((await desk.get('/api/orders?q=roof-77')).body.orders.map((o: { id: number }) => o.id)).toEqual([c.id]);
    const page = (await desk.get('/api/orders?sort=requested_date&dir=asc&page=2&page_size=2')).body;
    expect(page).toMatchObject({ total: 3, page: 2, page_size: 2 });
    expect(page.orders.map((o: { id: number }) => o.id)).toEqual([b.id]);
    const badStage = await desk.get('/api/orders?statuses=sent,shipped');
    expect(badStage.status).toBe(422);
    expect(badStage.body.error.details[0]).toMatchObject({ path: 'statuses', message: expect.stringMatching(/"shipped" is not a stage/) });
    const badRange = await desk.get(`/api/orders?date_from=${inDays(6)}&date_to=${inDays(4)}`);
    expect(badRange.status).toBe(422);
    expect(badRange.body.error.details[0].path).toBe('date_to');

    const other = await login(rival.salesEmail);
    expect((await other.get('/api/orders')).body).toMatchObject({ orders: [], total: 0 });
    expect((await other.get(`/api/orders/${a.id}`)).status).toBe(404);
  });
});

describe('turning down, comments and the timeline', () => {
  it('turns an order down with a reason and tells the contractor; it can no longer be confirmed', async () => {
    const m = await merchant();
    const k = await contractorWithEstimate(m);
    const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const desk = await login(m.salesEmail);
    expect((await desk.post(`/api/orders/${order.id}/turn-down`, {})).status).toBe(422);
    const res = await desk.post(`/api/orders/${order.id}/turn-down`, { reason: 'We no longer stock this tile' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'turned_down' });
    expect(res.body.timeline.at(-1)).toMatchObject({ kind: 'turned_down', summary: 'Turned down: We no longer stock this tile' });
    expect((await mailTo(k.email, /cannot supply/)).text).toMatch(/no longer stock/);
    expect((await desk.post(`/api/orders/${order.id}/confirm`, {})).status).toBe(409);
    expect((await k.c.post(`/api/orders/${order.id}/turn-down`, { reason: 'x' })).status).toBe(403);
  });

  it('carries comments both ways, each on the timeline with who and when', async () => {
    const m = await merchant();
    const k = await contractorWithEstimate(m);
    const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const desk = await login(m.salesEmail);
    expect((await k.c.post(`/api/orders/${order.id}/comments`, { body: 'Can you bring it before 9?' })).status).toBe(201);
    expect((await desk.post(`/api/orders/${order.id}/comments`, { body: 'Yes, first drop of the day.' })).status).toBe(201);
    expect((await desk.post(`/api/orders/${order.id}/comments`, { body: '   ' })).status).toBe(422);
    const list = (await k.c.get(`/api/orders/${order.id}/comments`)).body.comments;
    expect(list.map((c: { side: string; body: string }) => [c.side, c.body])).toEqual([
      ['contractor', 'Can you bring it before 9?'],
      ['merchant', 'Yes, first drop of the day.'],
    ]);
    const detail = orderDetailSchema.parse((await desk.get(`/api/orders/${order.id}`)).body);
    expect(detail.comments).toHaveLength(2);
    expect(detail.timeline.filter((e) => e.kind === 'commented').map((e) => e.actor.organisation?.id)).toEqual([k.organisationId, m.organisationId]);
    expect((await (await login(m.driverEmail)).post(`/api/orders/${order.id}/comments`, { body: 'hi' })).status).toBe(403);
  });
});

describe('no role reaches another organisation’s orders through the desk steps', () => {
  for (const role of ROLES) {
    it(`${role}: confirm, turn down, slot, dispatch, delivery, comments and invoice on another firm’s order are refused`, async () => {
      const m = await merchant();
      const k = await contractorWithEstimate(m);
      const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
      const snapshot = async () => ({
        order: await t.db('orders').where({ id: order.id }).first(),
        lines: await t.db('order_lines').where({ order_id: order.id }).orderBy('id'),
        stock: await t.db('branch_products').where({ branch_id: m.branchId }).orderBy('id'),
        comments: await t.db('order_comments').where({ order_id: order.id }),
      });
      const before = await snapshot();
      const actor = await makeOrgWithUser(t.db, kindOfRole(role), role);
      const c = await login(actor.email);
      const attempts = [
        await c.post(`/api/orders/${order.id}/confirm`, {}),
        await c.post(`/api/orders/${order.id}/turn-down`, { reason: 'hijack' }),
        await c.send('put', `/api/orders/${order.id}/slot`, { slot_id: 1 }),
        await c.delete(`/api/orders/${order.id}/slot`),
        await c.post(`/api/orders/${order.id}/dispatch`),
        await c.post(`/api/orders/${order.id}/delivery`, { received_by: 'x' }),
        await c.get(`/api/orders/${order.id}/comments`),
        await c.post(`/api/orders/${order.id}/comments`, { body: 'hijack' }),
        await c.post(`/api/orders/${order.id}/invoice`),
      ];
      for (const res of attempts) expect([403, 404], `${role}: ${res.status} ${JSON.stringify(res.body.error)}`).toContain(res.status);
      expect(await snapshot()).toEqual(before);
    });
  }
});
