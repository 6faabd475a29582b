import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, kindOfRole } from '../../shared/domain/roles';
import { orderListSchema, orderSchema } from '../../shared/schemas/order.schema';
import { DEMO_CATALOGUES } from '../../seeds/02-catalogue';
import { createTestApp, type TestApp } from '../setup/test-app';
import { inDays, signIn } from '../setup/scenario';
import { contractorWithEstimate as sharedContractor, merchantWithCatalogue, type TestMerchant } from '../setup/order-scenario';
import { makeOrgWithUser } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const [TOLLERBECK, CADDONMERE] = DEMO_CATALOGUES;

const login = (email: string) => signIn(t.app, email);

const merchant = (catalogue = TOLLERBECK) => merchantWithCatalogue(t, catalogue);

/** A contractor's estimator with a site (crane allowed, overhead lines present) and an estimate from the merchant's first system. */
const contractorWithEstimate = (m: TestMerchant, access: Record<string, string> = {}) => sharedContractor(t, m, { site_postcode: 'TB2 6FM', overhead_lines: 'present', ...access });

async function world() {
  const m = await merchant();
  const k = await contractorWithEstimate(m);
  return { m, k };
}

const orderBody = (k: { estimate: { id: number } }, m: { branchId: number }, over: Record<string, unknown> = {}) => ({
  estimate_id: k.estimate.id,
  branch_id: m.branchId,
  requested_date: inDays(7),
  time_window: '07:30-12:00',
  delivery_method: 'roof',
  notes: 'Ring Lowri on arrival',
  po_reference: 'PO-4471',
  ...over,
});

const snapshot = async (orderId: number) => ({
  order: await t.db('orders').where({ id: orderId }).first(),
  lines: await t.db('order_lines').where({ order_id: orderId }).orderBy('id'),
  proposals: await t.db('order_proposals').where({ order_id: orderId }).orderBy('id'),
});

describe('placing an order from an estimate', () => {
  it('sends the estimate’s lines to the branch at its prices, with the site copied, and e-mails both sides', async () => {
    const { m, k } = await world();
    const res = await k.c.post('/api/orders', orderBody(k, m));
    expect(res.status).toBe(201);
    const o = orderSchema.parse(res.body);
    expect(o).toMatchObject({ status: 'sent', revision: 1, requested_date: inDays(7), time_window: '07:30-12:00', delivery_method: 'roof', po_reference: 'PO-4471' });
    expect(o.reference).toMatch(/^RL-\d{6}$/);
    expect(o.lines.map((l) => [l.sku, l.quantity])).toEqual(k.estimate.lines.map((l: { sku: string; packs: number }) => [l.sku, l.packs]));
    expect(o.subtotal).toBe(k.estimate.totals.subtotal);
    expect(o.site).toMatchObject({ name: 'Ferncombe Mews', set_down_place: 'Verge by plot 1', crane_lift: 'allowed', overhead_lines: 'present' });
    expect(o.timeline).toEqual([expect.objectContaining({ kind: 'placed', actor: { name: expect.any(String), organisation: { id: k.organisationId, name: expect.any(String) } } })]);
    expect(o.allowed_actions.sort()).toEqual(['amend', 'cancel']);
    // Lifting onto the roof: the lift-plan caution first, then the overhead-lines warning, then the general ones.
    expect(o.cautions[0]).toMatch(/lift plan by a competent person/);
    expect(o.cautions[1]).toMatch(/Overhead lines/);
    expect(o.cautions.join(' ')).toMatch(/fixing specification/);

    expect((await t.mail.waitFor(k.email)).subject).toMatch(new RegExp(`Order ${o.reference} sent`));
    expect((await t.mail.waitFor(m.ownerEmail)).subject).toMatch(/New order/);
    expect((await t.mail.waitFor(m.salesEmail)).subject).toMatch(/New order/);
    expect(t.mail.messages.some((x) => x.to.includes(m.driverEmail) || x.to.includes(m.dispatcherEmail))).toBe(false);
  });

  it('sends lines adjusted before sending instead of the estimate’s', async () => {
    const { m, k } = await world();
    const res = await k.c.post(
      '/api/orders',
      orderBody(k, m, {
        lines: [
          { product_id: m.product('TRS-FL420-SG'), quantity: 500 },
          { product_id: m.product('TRS-CLP-FL'), quantity: 3 },
        ],
      }),
    );
    expect(res.status).toBe(201);
    expect(res.body.lines.map((l: { sku: string; quantity: number; total: number }) => [l.sku, l.quantity, l.total])).toEqual([
      ['TRS-FL420-SG', 500, 500 * 128],
      ['TRS-CLP-FL', 3, 3 * 1650],
    ]);
    expect(res.body.subtotal).toBe(500 * 128 + 3 * 1650);
  });

  it('rejects a past or impossible date, a bad time window, an unknown method and a crane lift the site forbids', async () => {
    const { m, k } = await world();
    const cases: [Record<string, unknown>, string][] = [
      [{ requested_date: inDays(-1) }, 'requested_date'],
      [{ requested_date: '2031-02-30' }, 'requested_date'],
      [{ time_window: '12:00-07:30' }, 'time_window'],
      [{ time_window: '7am' }, 'time_window'],
      [{ delivery_method: 'helicopter' }, 'delivery_method'],
      [{ branch_id: 999999 }, 'branch_id'],
      [{ lines: [{ product_id: m.product('TRS-FL420-SG'), quantity: 0 }] }, 'lines.0.quantity'],
    ];
    for (const [over, path] of cases) {
      const res = await k.c.post('/api/orders', orderBody(k, m, over));
      expect(res.status, JSON.stringify(over)).toBe(422);
      expect(
        res.body.error.details.map((d: { path: string }) => d.path),
        JSON.stringify(over),
      ).toContain(path);
    }
    const noCrane = await contractorWithEstimate(m, { crane_lift: 'not_allowed' });
    const res = await noCrane.c.post('/api/orders', orderBody(noCrane, m));
    expect(res.status).toBe(422);
    expect(res.body.error.details[0]).toMatchObject({ path: 'delivery_method', message: expect.stringMatching(/crane/) });
    expect(await t.db('orders').whereIn('contractor_organisation_id', [k.organisationId, noCrane.organisationId]).first()).toBeUndefined();
  });

  it('refuses products another merchant sells and a branch that does not sell the estimate’s products', async () => {
    const { m, k } = await world();
    const other = await merchant(CADDONMERE);
    const foreign = await k.c.post('/api/orders', orderBody(k, m, { lines: [{ product_id: other.product('CTT-WL380-RU'), quantity: 10 }] }));
    expect(foreign.status).toBe(422);
    expect(foreign.body.error.details[0].path).toBe('lines.0.product_id');
    const wrongBranch = await k.c.post('/api/orders', orderBody(k, other));
    expect(wrongBranch.status).toBe(422);
    expect(wrongBranch.body.error.details[0]).toMatchObject({ path: 'branch_id', message: expect.stringMatching(/does not sell TRS-/) });
  });

  it('refuses an estimate of another contractor', async () => {
    const { m, k } = await world();
    const stranger = await contractorWithEstimate(m);
    const res = await stranger.c.post('/api/orders', orderBody(k, m));
    expect(res.status).toBe(422);
    expect(res.body.error.details[0].path).toBe('estimate_id');
  });
});

describe('following orders from both sides', () => {
  it('lists a contractor’s own orders and a merchant’s orders to its branches, with filters and paging', async () => {
    const { m, k } = await world();
    const ids: number[] = [];
    for (let i = 0; i < 3; i++) ids.push((await k.c.post('/api/orders', orderBody(k, m, { po_reference: `PO-${i}` }))).body.id);
    await k.c.post(`/api/orders/${ids[0]}/cancel`, {});

    const mine = orderListSchema.parse((await k.c.get('/api/orders')).body);
    expect(mine.orders.map((o) => o.id)).toEqual([...ids].reverse());
    const sent = (await k.c.get('/api/orders?status=sent&sort=placed_at&dir=asc')).body;
    expect(sent.orders.map((o: { id: number }) => o.id)).toEqual([ids[1], ids[2]]);
    const byRef = (await k.c.get(`/api/orders?q=RL-${String(ids[2]).padStart(6, '0')}`)).body;
    expect(byRef.orders.map((o: { id: number }) => o.id)).toEqual([ids[2]]);
    const paged = (await k.c.get('/api/orders?page=2&page_size=2')).body;
    expect(paged).toMatchObject({ total: 3, page: 2 });
    expect(paged.orders).toHaveLength(1);

    for (const email of [m.ownerEmail, m.salesEmail, m.dispatcherEmail]) {
      const desk = await login(email);
      const list = (await desk.get('/api/orders')).body;
      expect(list.orders.map((o: { id: number }) => o.id).sort()).toEqual([...ids].sort());
      const detail = (await desk.get(`/api/orders/${ids[1]}`)).body;
      expect(detail.estimate_id).toBeNull();
      expect(detail.site.contact_phone).toBe('07700 900 301');
    }
    const driver = await login(m.driverEmail);
    expect((await driver.get('/api/orders')).status).toBe(403);

    const otherMerchant = await merchant(CADDONMERE);
    const rival = await login(otherMerchant.ownerEmail);
    expect((await rival.get('/api/orders')).body.orders).toEqual([]);
    expect((await rival.get(`/api/orders/${ids[1]}`)).status).toBe(404);
  });

  it('shows the dispatcher the order but offers it no step it may not take', async () => {
    const { m, k } = await world();
    const { id } = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const sales = (await (await login(m.salesEmail)).get(`/api/orders/${id}`)).body;
    expect(sales.allowed_actions.sort()).toEqual(['confirm', 'offer_changes', 'turn_down']);
    const yard = (await (await login(m.dispatcherEmail)).get(`/api/orders/${id}`)).body;
    expect(yard.allowed_actions).toEqual([]);
  });
});

describe('amending and cancelling', () => {
  it('amends lines and date until the merchant confirms, bumping the revision and telling the desk', async () => {
    const { m, k } = await world();
    const { id } = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const res = await k.c.patch(`/api/orders/${id}`, { revision: 1, requested_date: inDays(9), lines: [{ product_id: m.product('TRS-FL420-SG'), quantity: 1000 }] });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ revision: 2, status: 'sent', requested_date: inDays(9), subtotal: 1000 * 128, line_count: 1 });
    expect(res.body.timeline.map((e: { kind: string }) => e.kind)).toEqual(['placed', 'amended']);
    expect(res.body.timeline[1].summary).toMatch(/requested date, lines/);
    await t.mail.waitFor(m.salesEmail);
    expect(t.mail.messages.some((x) => x.to.includes(m.salesEmail) && /changed/.test(x.subject))).toBe(true);
  });

  it('refuses an amendment made on an old revision, and changes nothing', async () => {
    const { m, k } = await world();
    const { id } = (await k.c.post('/api/orders', orderBody(k, m))).body;
    await k.c.patch(`/api/orders/${id}`, { revision: 1, notes: 'first change' });
    const before = await snapshot(id);
    const stale = await k.c.patch(`/api/orders/${id}`, { revision: 1, notes: 'second change' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('order_changed');
    expect(await snapshot(id)).toEqual(before);
  });

  it('locks amendment and cancellation once the merchant has confirmed', async () => {
    const { m, k } = await world();
    const { id } = (await k.c.post('/api/orders', orderBody(k, m))).body;
    // The desk's confirmation (with stock reservation) is its own step; here the order is set confirmed directly.
    await t.db('orders').where({ id }).update({ status: 'confirmed', confirmed_at: new Date().toISOString() });
    const before = await snapshot(id);
    const amend = await k.c.patch(`/api/orders/${id}`, { revision: 1, notes: 'too late' });
    expect(amend.status).toBe(409);
    expect(amend.body.error.code).toBe('order_locked');
    expect((await k.c.post(`/api/orders/${id}/cancel`, {})).status).toBe(409);
    expect(await snapshot(id)).toEqual(before);
    expect((await k.c.get(`/api/orders/${id}`)).body.allowed_actions).toEqual([]);
  });

  it('cancels before confirmation and tells both sides', async () => {
    const { m, k } = await world();
    const { id } = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const res = await k.c.post(`/api/orders/${id}/cancel`, { reason: 'Scaffold not ready' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'cancelled', cancelled_at: expect.any(String) });
    expect(res.body.timeline.at(-1)).toMatchObject({ kind: 'cancelled', summary: 'Cancelled: Scaffold not ready' });
    await t.mail.waitFor(m.ownerEmail);
    expect(t.mail.messages.some((x) => x.to.includes(m.ownerEmail) && /cancelled/.test(x.subject))).toBe(true);
    expect(t.mail.messages.some((x) => x.to.includes(k.email) && /cancelled/.test(x.subject))).toBe(true);
  });
});

describe('the merchant’s changes and the contractor’s answer', () => {
  async function offered() {
    const { m, k } = await world();
    const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const tiles = order.lines.find((l: { sku: string }) => l.sku === 'TRS-FL420-SG');
    const ridge = order.lines.find((l: { sku: string }) => l.sku === 'TRS-RHR-SG');
    const desk = await login(m.salesEmail);
    const res = await desk.post(`/api/orders/${order.id}/proposals`, {
      revision: 1,
      message: 'Short of grey ridge this week',
      lines: [
        { line_id: tiles.id, confirmed_quantity: tiles.quantity - 200, back_order_quantity: 200 },
        { line_id: ridge.id, confirmed_quantity: 10, back_order_quantity: 0, substitute: { product_id: m.product('TRS-RCL-BR'), quantity: ridge.quantity - 10 } },
      ],
      proposed_date: inDays(10),
      proposed_time_window: '08:00-10:00',
    });
    return { m, k, order, tiles, ridge, desk, res };
  }

  it('records the desk’s offer (part now, part back-ordered, a substitute, a new day) and e-mails the contractor', async () => {
    const { k, order, res } = await offered();
    expect(res.status).toBe(201);
    const o = orderSchema.parse(res.body.order);
    expect(o.status).toBe('changes_offered');
    expect(o.proposals).toHaveLength(1);
    expect(o.proposals[0]).toMatchObject({ status: 'open', order_revision: 1, proposed_date: inDays(10), message: 'Short of grey ridge this week' });
    expect(o.proposals[0].lines[1].substitute).toMatchObject({ sku: 'TRS-RCL-BR', unit_price: 1150 });
    const seen = (await k.c.get(`/api/orders/${order.id}`)).body;
    expect(seen.allowed_actions.sort()).toEqual(['accept_changes', 'amend', 'cancel', 'decline_changes']);
    const mail = await t.mail.waitFor(k.email);
    expect(t.mail.messages.some((x) => x.to.includes(k.email) && /offers changes/.test(x.subject))).toBe(true);
    expect(mail).toBeDefined();
  });

  it('accepting makes the offer the order: agreed and back-ordered packs, the substitute as a new line, the new day', async () => {
    const { m, k, order, tiles, ridge, res } = await offered();
    const pid = res.body.proposal_id;
    const accepted = await k.c.post(`/api/orders/${order.id}/proposals/${pid}/accept`, { note: 'Brindle ridge is fine' });
    expect(accepted.status).toBe(200);
    const o = orderSchema.parse(accepted.body);
    expect(o).toMatchObject({ status: 'agreed', revision: 2, requested_date: inDays(10), time_window: '08:00-10:00' });
    const byId = new Map(o.lines.map((l) => [l.id, l]));
    expect(byId.get(tiles.id)).toMatchObject({ confirmed_quantity: tiles.quantity - 200, back_order_quantity: 200, status: 'part_agreed', total: tiles.quantity * 128 });
    expect(byId.get(ridge.id)).toMatchObject({ confirmed_quantity: 10, back_order_quantity: 0, status: 'part_agreed', total: 10 * 650 });
    const sub = o.lines.find((l) => l.replaces_line_id === ridge.id)!;
    expect(sub).toMatchObject({ sku: 'TRS-RCL-BR', quantity: ridge.quantity - 10, status: 'substitute', unit_price: 1150 });
    const untouched = o.lines.filter((l) => l.id !== tiles.id && l.id !== ridge.id && l.status !== 'substitute');
    expect(untouched.every((l) => l.status === 'agreed' && l.confirmed_quantity === l.quantity)).toBe(true);
    expect(o.subtotal).toBe(o.lines.reduce((s, l) => s + l.total, 0));
    expect(o.proposals[0]).toMatchObject({ status: 'accepted', answered_by: { id: k.userId } });
    expect(o.timeline.map((e) => e.kind)).toEqual(['placed', 'changes_offered', 'changes_accepted']);
    await t.mail.waitFor(m.salesEmail);
    expect(t.mail.messages.some((x) => x.to.includes(m.salesEmail) && /accepted your changes/.test(x.subject))).toBe(true);
    // An accepted offer cannot be answered again.
    expect((await k.c.post(`/api/orders/${order.id}/proposals/${pid}/decline`, {})).status).toBe(409);
  });

  it('declining leaves the lines as sent and hands the order back to the desk', async () => {
    const { k, order, res } = await offered();
    const before = (await snapshot(order.id)).lines;
    const declined = await k.c.post(`/api/orders/${order.id}/proposals/${res.body.proposal_id}/decline`, { note: 'Need grey ridge' });
    expect(declined.status).toBe(200);
    expect(declined.body).toMatchObject({ status: 'sent', revision: 1 });
    expect(declined.body.proposals[0].status).toBe('declined');
    expect((await snapshot(order.id)).lines).toEqual(before);
  });

  it('an amendment while an offer is open makes the offer lapse', async () => {
    const { k, order, res } = await offered();
    await k.c.patch(`/api/orders/${order.id}`, { revision: 1, notes: 'Changed my mind about the day' });
    const late = await k.c.post(`/api/orders/${order.id}/proposals/${res.body.proposal_id}/accept`, {});
    expect(late.status).toBe(409);
    expect((await k.c.get(`/api/orders/${order.id}`)).body.proposals[0].status).toBe('superseded');
  });

  it('rejects an offer that confirms more than was asked or substitutes a product the branch does not sell', async () => {
    const { m, k } = await world();
    const other = await merchant(CADDONMERE);
    const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
    const line = order.lines[0];
    const desk = await login(m.ownerEmail);
    const before = await snapshot(order.id);
    const res = await desk.post(`/api/orders/${order.id}/proposals`, {
      revision: 1,
      lines: [
        { line_id: line.id, confirmed_quantity: line.quantity, back_order_quantity: 1 },
        { line_id: order.lines[1].id, confirmed_quantity: 0, substitute: { product_id: other.product('CTT-RSR-RU'), quantity: 5 } },
        { line_id: 999999, confirmed_quantity: 0 },
      ],
    });
    expect(res.status).toBe(422);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(['lines.0.confirmed_quantity', 'lines.1.substitute.product_id', 'lines.2.line_id']);
    expect(await snapshot(order.id)).toEqual(before);
    expect((await desk.post(`/api/orders/${order.id}/proposals`, { revision: 1 })).status).toBe(422);
    expect((await desk.post(`/api/orders/${order.id}/proposals`, { revision: 7, proposed_date: inDays(8) })).body.error.code).toBe('order_changed');
  });

  it('keeps each side to its own steps', async () => {
    const { m, k, order, res } = await offered();
    expect((await k.c.post(`/api/orders/${order.id}/proposals`, { revision: 1, proposed_date: inDays(8) })).status).toBe(403);
    const desk = await login(m.salesEmail);
    expect((await desk.post(`/api/orders/${order.id}/proposals/${res.body.proposal_id}/accept`, {})).status).toBe(403);
    expect((await desk.patch(`/api/orders/${order.id}`, { revision: 1, notes: 'desk edit' })).status).toBe(403);
    const yard = await login(m.dispatcherEmail);
    expect((await yard.post(`/api/orders/${order.id}/proposals`, { revision: 1, proposed_date: inDays(8) })).status).toBe(403);
  });
});

describe('no role reaches another organisation’s orders', () => {
  for (const role of ROLES) {
    it(`${role}: every step on an order between two other firms is refused and changes nothing`, async () => {
      const { m, k } = await world();
      const order = (await k.c.post('/api/orders', orderBody(k, m))).body;
      const desk = await login(m.salesEmail);
      const proposal = (await desk.post(`/api/orders/${order.id}/proposals`, { revision: 1, proposed_date: inDays(8) })).body.proposal_id;
      const before = await snapshot(order.id);

      const actor = await makeOrgWithUser(t.db, kindOfRole(role), role);
      const c = await login(actor.email);
      const attempts = [
        await c.get(`/api/orders/${order.id}`),
        await c.patch(`/api/orders/${order.id}`, { revision: 1, notes: 'hijack' }),
        await c.post(`/api/orders/${order.id}/cancel`, {}),
        await c.post(`/api/orders/${order.id}/proposals`, { revision: 1, proposed_date: inDays(8) }),
        await c.post(`/api/orders/${order.id}/proposals/${proposal}/accept`, {}),
        await c.post(`/api/orders/${order.id}/proposals/${proposal}/decline`, {}),
        await c.post('/api/orders', orderBody(k, m)),
      ];
      for (const res of attempts) expect([403, 404, 422], `${role}: ${res.status} ${JSON.stringify(res.body.error)}`).toContain(res.status);
      expect(await snapshot(order.id)).toEqual(before);
      const list = await c.get('/api/orders');
      if (list.status === 200) expect(list.body.orders).toEqual([]);
      else expect(list.status).toBe(403);
      expect(await t.db('orders').where({ contractor_organisation_id: actor.organisationId }).first()).toBeUndefined();
    });
  }
});
