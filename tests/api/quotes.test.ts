import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, kindOfRole } from '../../shared/domain/roles';
import { acceptQuoteResponseSchema, quoteRequestListSchema, quoteRequestSchema } from '../../shared/schemas/order.schema';
import { DEMO_CATALOGUES, installCatalogue } from '../../seeds/02-catalogue';
import { createTestApp, type TestApp } from '../setup/test-app';
import { GABLE_CSV as GABLE, inDays, signIn } from '../setup/scenario';
import { makeOrgWithUser, makeUser } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const [TOLLERBECK, CADDONMERE] = DEMO_CATALOGUES;

const login = (email: string) => signIn(t.app, email);

async function merchant(catalogue = TOLLERBECK) {
  const owner = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
  const installed = await installCatalogue(t.db, owner.organisationId, [{ id: owner.branchId!, priceFactor: 1, stockFactor: 1 }], catalogue);
  const sales = await makeUser(t.db, owner.organisationId, 'merchant_sales');
  return { ...owner, branchId: owner.branchId!, salesEmail: sales.email, product: (sku: string) => installed.productIds.get(sku)!, systemId: installed.systemIds[0].id };
}

async function contractorWithEstimate(systemId: number) {
  const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
  const c = await login(u.email);
  const p = await c.post('/api/projects', { name: 'Yarrowby Chase', site_address: 'Yarrowby Chase, Cindermoor', site_postcode: 'CX4 1YC', crane_lift: 'allowed', overhead_lines: 'none' });
  const token = await c.csrf();
  await c.agent.post(`/api/projects/${p.body.id}/schedule`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(GABLE);
  const e = await c.post(`/api/projects/${p.body.id}/estimates`, { system_id: systemId });
  expect(e.status).toBe(201);
  return { ...u, c, estimate: e.body, projectId: p.body.id as number };
}

/** Three branches of two merchants asked for one estimate. */
async function asked() {
  const a = await merchant();
  const b = await merchant(CADDONMERE);
  const c2 = await merchant(CADDONMERE);
  const k = await contractorWithEstimate(a.systemId);
  const res = await k.c.post('/api/quote-requests', {
    estimate_id: k.estimate.id,
    branch_ids: [a.branchId, b.branchId, c2.branchId],
    requested_date: inDays(12),
    time_window: '07:00-11:00',
    delivery_method: 'roof',
    po_reference: 'YC-19',
  });
  expect(res.status).toBe(201);
  const quoteFor = (branchId: number) => res.body.quotes.find((q: { branch: { id: number } }) => q.branch.id === branchId).id as number;
  return { a, b, c2, k, request: res.body, quoteFor };
}

const lineOf = (request: { lines: { id: number; category: string }[] }, category: string) => request.lines.find((l) => l.category === category)!.id;

describe('asking up to three branches for a quote', () => {
  it('sends the estimate’s quantities to each branch and tells each desk', async () => {
    const { a, b, k, request } = await asked();
    const r = quoteRequestSchema.parse(request);
    expect(r).toMatchObject({ status: 'open', requested_date: inDays(12), delivery_method: 'roof', po_reference: 'YC-19' });
    expect(r.quotes.map((q) => q.status)).toEqual(['asked', 'asked', 'asked']);
    expect(r.lines.map((l) => [l.category, l.quantity])).toEqual(k.estimate.lines.map((l: { category: string; quantity: number }) => [l.category, l.quantity]));
    expect(r.comparison?.rows).toHaveLength(r.lines.length);
    expect(r.cautions[0]).toMatch(/lift plan/);
    await t.mail.waitFor(a.email);
    await t.mail.waitFor(b.salesEmail);
    expect(t.mail.messages.filter((m) => /Quote request from/.test(m.subject) && (m.to.includes(a.email) || m.to.includes(b.salesEmail)))).toHaveLength(2);
  });

  it('refuses more than three branches, a branch twice, a past date and an unknown branch', async () => {
    const a = await merchant();
    const k = await contractorWithEstimate(a.systemId);
    const base = { estimate_id: k.estimate.id, requested_date: inDays(5), delivery_method: 'ground' };
    const four = await k.c.post('/api/quote-requests', { ...base, branch_ids: [1, 2, 3, 4] });
    expect(four.body.error.details[0].path).toBe('branch_ids');
    expect((await k.c.post('/api/quote-requests', { ...base, branch_ids: [a.branchId, a.branchId] })).status).toBe(422);
    const past = await k.c.post('/api/quote-requests', { ...base, branch_ids: [a.branchId], requested_date: inDays(-2) });
    expect(past.body.error.details[0].path).toBe('requested_date');
    const unknown = await k.c.post('/api/quote-requests', { ...base, branch_ids: [a.branchId, 999999] });
    expect(unknown.body.error.details[0].path).toBe('branch_ids.1');
    expect(await t.db('quote_requests').where({ contractor_organisation_id: k.organisationId }).first()).toBeUndefined();
  });
});

describe('merchants answer and the contractor compares', () => {
  it('lets a desk price the lines with its own products and see only its own quote', async () => {
    const { b, k, request, quoteFor } = await asked();
    const desk = await login(b.salesEmail);
    const view = (await desk.get(`/api/quote-requests/${request.id}`)).body;
    expect(view.quotes.map((q: { id: number }) => q.id)).toEqual([quoteFor(b.branchId)]);
    expect(view.comparison).toBeNull();
    expect(view.site).toMatchObject({ site_postcode: 'CX4 1YC', crane_lift: 'allowed' });

    const tilesLine = request.lines.find((l: { category: string }) => l.category === 'tile');
    const res = await desk.post(`/api/quotes/${quoteFor(b.branchId)}/answer`, {
      lines: [
        { request_line_id: tilesLine.id, product_id: b.product('CTT-WL380-RU') },
        { request_line_id: lineOf(request, 'batten'), product_id: b.product('CTT-BAT-3825'), unit_price: 430 },
      ],
      valid_until: inDays(20),
      message: 'Russet only',
    });
    expect(res.status).toBe(200);
    const q = res.body.quotes[0];
    expect(q).toMatchObject({ status: 'answered', valid_until: inDays(20), message: 'Russet only' });
    // Packs default to enough for the quantity asked (whole tiles); the price to the branch's own.
    expect(q.lines[0]).toMatchObject({ sku: 'CTT-WL380-RU', packs: Math.ceil(tilesLine.quantity), unit_price: 89, total: Math.ceil(tilesLine.quantity) * 89 });
    expect(q.lines[1]).toMatchObject({ unit_price: 430 });
    expect(q.total).toBe(q.lines[0].total + q.lines[1].total);
    await t.mail.waitFor(k.email);
    expect(t.mail.messages.some((m) => m.to.includes(k.email) && /priced your quote request/.test(m.subject))).toBe(true);
  });

  it('refuses a product of another merchant and a line of another request', async () => {
    const { a, b, request, quoteFor } = await asked();
    const desk = await login(b.salesEmail);
    const res = await desk.post(`/api/quotes/${quoteFor(b.branchId)}/answer`, {
      lines: [
        { request_line_id: lineOf(request, 'tile'), product_id: a.product('TRS-FL420-SG') },
        { request_line_id: 999999, product_id: b.product('CTT-WL380-RU') },
      ],
    });
    expect(res.status).toBe(422);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(['lines.0.product_id', 'lines.1.request_line_id']);
    expect(
      (
        await t
          .db('quotes')
          .where({ id: quoteFor(b.branchId) })
          .first()
      ).status,
    ).toBe('asked');
  });

  it('compares the answers side by side and turns the accepted one into an order at its prices', async () => {
    const { a, b, c2, k, request, quoteFor } = await asked();
    const tileLine = lineOf(request, 'tile');
    const ridgeLine = lineOf(request, 'ridge');
    await (
      await login(a.salesEmail)
    ).post(`/api/quotes/${quoteFor(a.branchId)}/answer`, {
      lines: [
        { request_line_id: tileLine, product_id: a.product('TRS-FL420-SG'), unit_price: 120 },
        { request_line_id: ridgeLine, product_id: a.product('TRS-RHR-SG') },
      ],
    });
    await (
      await login(b.salesEmail)
    ).post(`/api/quotes/${quoteFor(b.branchId)}/answer`, {
      lines: [{ request_line_id: tileLine, product_id: b.product('CTT-WL380-RU') }],
    });
    const declined = await (await login(c2.email)).post(`/api/quotes/${quoteFor(c2.branchId)}/decline`, { message: 'No lorry that week' });
    expect(declined.body.quotes[0].status).toBe('declined');

    const r = quoteRequestSchema.parse((await k.c.get(`/api/quote-requests/${request.id}`)).body);
    const cmp = r.comparison!;
    expect(cmp.quote_ids).toEqual([quoteFor(a.branchId), quoteFor(b.branchId), quoteFor(c2.branchId)]);
    const tiles = cmp.rows.find((row) => row.request_line_id === tileLine)!;
    expect(tiles.offers.map((o) => o?.unit_price ?? null)).toEqual([120, 89, null]);
    const ridge = cmp.rows.find((row) => row.request_line_id === ridgeLine)!;
    expect(ridge.offers[1]).toBeNull();
    expect(cmp.totals.map((x) => x.lines_missing)).toEqual([r.lines.length - 2, r.lines.length - 1, r.lines.length]);
    expect(cmp.totals[2].total).toBeNull();

    const accepted = await k.c.post(`/api/quotes/${quoteFor(a.branchId)}/accept`);
    expect(accepted.status).toBe(201);
    acceptQuoteResponseSchema.parse(accepted.body);
    expect(accepted.body.order).toMatchObject({ status: 'sent', reference: expect.stringMatching(/^RL-/) });
    const order = (await k.c.get(`/api/orders/${accepted.body.order.id}`)).body;
    expect(order).toMatchObject({ quote_id: quoteFor(a.branchId), branch: { id: a.branchId }, requested_date: inDays(12), time_window: '07:00-11:00', po_reference: 'YC-19' });
    expect(order.lines.map((l: { sku: string; unit_price: number }) => [l.sku, l.unit_price])).toEqual([
      ['TRS-FL420-SG', 120],
      ['TRS-RHR-SG', 650],
    ]);
    const after = accepted.body.quote_request;
    expect(after.status).toBe('accepted');
    expect(after.quotes.map((q: { status: string }) => q.status)).toEqual(['accepted', 'not_chosen', 'declined']);
    await t.mail.waitFor(b.salesEmail);
    expect(t.mail.messages.some((m) => m.to.includes(b.salesEmail) && /went elsewhere/.test(m.subject))).toBe(true);

    // Closed: no second acceptance, no late answer.
    expect((await k.c.post(`/api/quotes/${quoteFor(b.branchId)}/accept`)).status).toBe(409);
    const late = await (await login(b.salesEmail)).post(`/api/quotes/${quoteFor(b.branchId)}/answer`, { lines: [{ request_line_id: tileLine, product_id: b.product('CTT-WL380-RU') }] });
    expect(late.status).toBe(409);
    expect(
      await t
        .db('orders')
        .where({ quote_id: quoteFor(b.branchId) })
        .first(),
    ).toBeUndefined();
  });

  it('cannot accept a quote that is not priced yet, or one past its date', async () => {
    const { a, k, request, quoteFor } = await asked();
    const notYet = await k.c.post(`/api/quotes/${quoteFor(a.branchId)}/accept`);
    expect(notYet.status).toBe(409);
    expect(notYet.body.error.code).toBe('quote_not_priced');
    await (await login(a.salesEmail)).post(`/api/quotes/${quoteFor(a.branchId)}/answer`, { lines: [{ request_line_id: lineOf(request, 'tile'), product_id: a.product('TRS-FL420-SG') }] });
    await t
      .db('quotes')
      .where({ id: quoteFor(a.branchId) })
      .update({ valid_until: inDays(-1) });
    const expired = await k.c.post(`/api/quotes/${quoteFor(a.branchId)}/accept`);
    expect(expired.body.error.code).toBe('quote_expired');
    expect(await t.db('orders').where({ contractor_organisation_id: k.organisationId }).first()).toBeUndefined();
  });

  it('withdraws a request, closing every quote', async () => {
    const { k, request } = await asked();
    const res = await k.c.post(`/api/quote-requests/${request.id}/withdraw`);
    expect(res.body.status).toBe('withdrawn');
    expect(res.body.quotes.every((q: { status: string }) => q.status === 'withdrawn')).toBe(true);
    expect((await k.c.post(`/api/quote-requests/${request.id}/withdraw`)).status).toBe(409);
  });

  it('lists requests for the contractor and, for a merchant, only those sent to it', async () => {
    const { a, k, request } = await asked();
    const mine = quoteRequestListSchema.parse((await k.c.get('/api/quote-requests')).body);
    expect(mine.quote_requests.map((r) => r.id)).toEqual([request.id]);
    const desk = quoteRequestListSchema.parse((await (await login(a.salesEmail)).get('/api/quote-requests')).body);
    expect(desk.quote_requests.map((r) => r.id)).toContain(request.id);
    expect(desk.quote_requests.find((r) => r.id === request.id)!.quotes.map((q) => q.branch.id)).toEqual([a.branchId]);
  });
});

describe('the quote-request list filters, searches, sorts and pages in SQL', () => {
  it('pages a contractor’s requests newest first or by day wanted, counts them all, and finds one by number, site or PO', async () => {
    const a = await merchant();
    const k = await contractorWithEstimate(a.systemId);
    const ids: number[] = [];
    for (let i = 0; i < 5; i++) {
      const res = await k.c.post('/api/quote-requests', { estimate_id: k.estimate.id, branch_ids: [a.branchId], requested_date: inDays(20 - i), delivery_method: 'ground', po_reference: `YC-${i}` });
      expect(res.status).toBe(201);
      ids.push(res.body.id);
    }
    const page = async (query: string) => quoteRequestListSchema.parse((await k.c.get(`/api/quote-requests?${query}`)).body);
    const first = await page('page_size=2');
    expect(first).toMatchObject({ total: 5, page: 1, page_size: 2 });
    expect(first.quote_requests.map((r) => r.id)).toEqual([ids[4], ids[3]]);
    expect((await page('page_size=2&page=3')).quote_requests.map((r) => r.id)).toEqual([ids[0]]);
    expect((await page('sort=requested_date&dir=asc&page_size=5')).quote_requests.map((r) => r.id)).toEqual([ids[4], ids[3], ids[2], ids[1], ids[0]]);
    expect((await page(`q=Q-${ids[2]}`)).quote_requests.map((r) => r.id)).toEqual([ids[2]]);
    expect((await page('q=yc-3')).quote_requests.map((r) => r.id)).toEqual([ids[3]]);
    expect((await page('q=yarrowby')).total).toBe(5);
    expect((await page('q=nowhere')).total).toBe(0);

    await k.c.post(`/api/quote-requests/${ids[1]}/withdraw`);
    expect((await page('status=withdrawn')).quote_requests.map((r) => r.id)).toEqual([ids[1]]);
    expect((await page('status=open')).total).toBe(4);

    const bad = await k.c.get('/api/quote-requests?sort=price&page=0&status=lost&page_size=500');
    expect(bad.status).toBe(422);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['page', 'page_size', 'sort', 'status']);
  });

  it('shows a desk only the requests still waiting for its own price when it asks', async () => {
    const { a, b, k, request, quoteFor } = await asked();
    const second = await k.c.post('/api/quote-requests', { estimate_id: k.estimate.id, branch_ids: [a.branchId, b.branchId], requested_date: inDays(15), delivery_method: 'ground' });
    const deskA = await login(a.salesEmail);
    await deskA.post(`/api/quotes/${quoteFor(a.branchId)}/answer`, { lines: [{ request_line_id: lineOf(request, 'tile'), product_id: a.product('TRS-FL420-SG') }] });
    const waiting = quoteRequestListSchema.parse((await deskA.get('/api/quote-requests?waiting=true')).body);
    expect(waiting.quote_requests.map((r) => r.id)).toEqual([second.body.id]);
    const answered = quoteRequestListSchema.parse((await deskA.get('/api/quote-requests?waiting=false')).body);
    expect(answered.quote_requests.map((r) => r.id)).toEqual([request.id]);
    // The other merchant has answered neither.
    const deskB = quoteRequestListSchema.parse((await (await login(b.salesEmail)).get('/api/quote-requests?waiting=true')).body);
    expect(deskB.quote_requests.map((r) => r.id).sort()).toEqual([request.id, second.body.id].sort());
  });
});

describe('no role reaches another organisation’s quote requests', () => {
  for (const role of ROLES) {
    it(`${role}: reading, answering, declining, accepting and withdrawing are refused and change nothing`, async () => {
      const { a, request, quoteFor } = await asked();
      await (await login(a.salesEmail)).post(`/api/quotes/${quoteFor(a.branchId)}/answer`, { lines: [{ request_line_id: lineOf(request, 'tile'), product_id: a.product('TRS-FL420-SG') }] });
      const before = await t.db('quotes').where({ quote_request_id: request.id }).orderBy('id');
      const actor = await makeOrgWithUser(t.db, kindOfRole(role), role);
      const c = await login(actor.email);
      const attempts = [
        await c.get(`/api/quote-requests/${request.id}`),
        await c.post(`/api/quotes/${quoteFor(a.branchId)}/answer`, { lines: [{ request_line_id: lineOf(request, 'tile'), product_id: a.product('TRS-FL420-SG') }] }),
        await c.post(`/api/quotes/${quoteFor(a.branchId)}/decline`, {}),
        await c.post(`/api/quotes/${quoteFor(a.branchId)}/accept`),
        await c.post(`/api/quote-requests/${request.id}/withdraw`),
      ];
      for (const res of attempts) expect([403, 404], `${role}: ${res.status}`).toContain(res.status);
      expect(await t.db('quotes').where({ quote_request_id: request.id }).orderBy('id')).toEqual(before);
      expect((await t.db('quote_requests').where({ id: request.id }).first()).status).toBe('open');
      const list = await c.get('/api/quote-requests');
      if (list.status === 200) expect(list.body.quote_requests).toEqual([]);
      else expect(list.status).toBe(403);
    });
  }
});
