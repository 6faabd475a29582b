import ExcelJS from 'exceljs';
import Stripe from 'stripe';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, kindOfRole } from '../../shared/domain/roles';
import { invoiceSchema } from '../../shared/schemas/invoice.schema';
import { startPaymentResultSchema } from '../../shared/schemas/payment.schema';
import { DEMO_CATALOGUES, installCatalogue } from '../../seeds/02-catalogue';
import { createTestApp, type TestApp } from '../setup/test-app';
import { GABLE_CSV as GABLE, inDays, signIn } from '../setup/scenario';
import { makeOrgWithUser, makeUser } from '../setup/factories';
import { loadRunOf } from '../setup/order-scenario';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const [TOLLERBECK] = DEMO_CATALOGUES;
const today = () => new Date().toISOString().slice(0, 10);

// The provider's published test cards: 4242… succeeds, 4000 0000 0000 0002 is a generic decline.
const CARD_OK = '4242 4242 4242 4242';
const CARD_DECLINED = '4000 0000 0000 0002';

const login = (email: string) => signIn(t.app, email);

async function merchant() {
  const owner = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
  const installed = await installCatalogue(t.db, owner.organisationId, [{ id: owner.branchId!, priceFactor: 1, stockFactor: 1 }], TOLLERBECK);
  const sales = await makeUser(t.db, owner.organisationId, 'merchant_sales');
  return {
    organisationId: owner.organisationId,
    branchId: owner.branchId!,
    ownerEmail: owner.email,
    salesEmail: sales.email,
    desk: await login(sales.email),
    product: (sku: string) => installed.productIds.get(sku)!,
    systemId: installed.systemIds[0].id,
  };
}
type Merchant = Awaited<ReturnType<typeof merchant>>;

async function contractor(m: Merchant) {
  const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
  const c = await login(u.email);
  const p = await c.post('/api/projects', { name: 'Ferncombe Mews', site_address: '1–4 Ferncombe Mews, Tollerbeck', crane_lift: 'allowed' });
  const token = await c.csrf();
  await c.agent.post(`/api/projects/${p.body.id}/schedule`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(GABLE);
  const e = await c.post(`/api/projects/${p.body.id}/estimates`, { system_id: m.systemId });
  return { ...u, c, estimate: e.body };
}

/** A confirmed order of 360 tiles at 128p and 10 battens at 440p, invoiced from the confirmed packs. */
async function invoiced(m: Merchant, k: Awaited<ReturnType<typeof contractor>>) {
  const order = await k.c.post('/api/orders', {
    estimate_id: k.estimate.id,
    branch_id: m.branchId,
    requested_date: inDays(5),
    delivery_method: 'ground',
    lines: [
      { product_id: m.product('TRS-FL420-SG'), quantity: 360 },
      { product_id: m.product('TRS-BAT-3825'), quantity: 10 },
    ],
  });
  expect((await m.desk.post(`/api/orders/${order.body.id}/confirm`, {})).status).toBe(200);
  const inv = await m.desk.post(`/api/orders/${order.body.id}/invoice`);
  expect(inv.status, JSON.stringify(inv.body)).toBe(201);
  return { orderId: order.body.id as number, invoice: invoiceSchema.parse(inv.body) };
}

/** Types a card on the fake's own hosted page, as a person would: plain HTTP to the fake, never to the app. */
async function payOnHostedPage(checkoutUrl: string, card: string) {
  const url = new URL(checkoutUrl);
  const page = await request(url.origin).get(url.pathname);
  expect(page.status).toBe(200);
  expect(page.text).toMatch(/name="card_number"/);
  return request(url.origin).post(url.pathname).type('form').send({ card_number: card, expiry: '12/34', cvc: '123', name: 'Tamsin Orrell' });
}

describe('issuing invoices', () => {
  it('numbers invoices per merchant without gaps, taxes each line at its product’s rate and totals in minor units', async () => {
    const m = await merchant();
    const k = await contractor(m);
    // Battens at the zero rate for this check; tiles at the 20 % standard rate (HMRC VAT rates, from memory).
    expect((await m.desk.patch(`/api/products/${m.product('TRS-BAT-3825')}`, { tax_rate_bp: 0 })).status).toBe(200);
    const { orderId, invoice } = await invoiced(m, k);
    expect(invoice.number).toBe('INV-000001');
    const tiles = invoice.lines.find((l) => l.sku === 'TRS-FL420-SG')!;
    expect(tiles).toMatchObject({ quantity: 360, unit_price: 128, tax_rate_bp: 2000, net: 46080, tax: 9216, total: 55296 });
    expect(invoice.lines.find((l) => l.sku === 'TRS-BAT-3825')).toMatchObject({ quantity: 10, net: 4400, tax: 0, total: 4400 });
    expect(invoice).toMatchObject({ subtotal: 50480, tax_total: 9216, total: 59696, currency: 'GBP', basis: 'confirmed', pay_by: 'card', due_date: null, status: 'unpaid', balance: 59696 });
    // A refused second issue takes no number.
    expect((await m.desk.post(`/api/orders/${orderId}/invoice`)).body.error.code).toBe('already_invoiced');
    expect((await invoiced(m, k)).invoice.number).toBe('INV-000002');
    // Another merchant's series starts at 1.
    const other = await merchant();
    expect((await invoiced(other, await contractor(other))).invoice.number).toBe('INV-000001');
    expect(t.mail.messages.some((x) => x.to.includes(k.email) && /Invoice INV-000001/.test(x.subject))).toBe(true);
    const detail = (await k.c.get(`/api/orders/${orderId}`)).body;
    expect(detail.invoice).toEqual({ id: invoice.id, number: 'INV-000001' });
    expect(detail.timeline.at(-1)).toMatchObject({ kind: 'invoiced' });
  });

  it('gives account customers a due date from their terms', async () => {
    const m = await merchant();
    const k = await contractor(m);
    await k.c.post('/api/orders', { estimate_id: k.estimate.id, branch_id: m.branchId, requested_date: inDays(5), delivery_method: 'ground' });
    expect((await m.desk.send('put', `/api/accounts/${k.organisationId}`, { terms_days: 30 })).body).toMatchObject({ terms_days: 30 });
    expect((await m.desk.send('put', `/api/accounts/${k.organisationId}`, { terms_days: -1 })).status).toBe(422);
    const stranger = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
    expect((await m.desk.send('put', `/api/accounts/${stranger.organisationId}`, { terms_days: 30 })).status).toBe(404);
    const { invoice } = await invoiced(m, k);
    expect(invoice.pay_by).toBe('account');
    expect(invoice.due_date).toBe(new Date(Date.parse(`${today()}T00:00:00Z`) + 30 * 86_400_000).toISOString().slice(0, 10));
    expect((await m.desk.get('/api/accounts')).body.accounts).toEqual([expect.objectContaining({ contractor: { id: k.organisationId, name: expect.any(String) }, terms_days: 30 })]);
  });

  it('prints the invoice as a page and exports it as .xlsx', async () => {
    const m = await merchant();
    const k = await contractor(m);
    const { invoice } = await invoiced(m, k);
    const page = await k.c.get(`/api/invoices/${invoice.id}/print`);
    expect(page.status).toBe(200);
    expect(page.headers['content-type']).toMatch(/text\/html/);
    expect(page.text).toMatch(/Invoice INV-000001/);
    // 360 × £1.28 + 10 × £4.40 = £504.80 net, £100.96 tax at 20 %: £605.76.
    expect(page.text).toMatch(/£605\.76/);
    const xlsx = await m.desk
      .get(`/api/invoices/${invoice.id}/export.xlsx`)
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(xlsx.body as ArrayBuffer);
    const ws = wb.worksheets[0];
    expect(ws.getRow(2).getCell(1).value).toBe('TRS-FL420-SG');
    expect(ws.getRow(2).getCell(9).value).toBe(552.96);
  });

  it('invoices the delivered packs once the delivery is recorded', async () => {
    const m = await merchant();
    const k = await contractor(m);
    const dispatcher = await makeUser(t.db, m.organisationId, 'merchant_dispatcher');
    const driver = await makeUser(t.db, m.organisationId, 'driver');
    const yard = await login(dispatcher.email);
    const lorry = (await yard.post(`/api/branches/${m.branchId}/lorries`, { registration: 'RL-IN01', payload_kg: 14000, pallet_slots: 12 })).body;
    const slot = (await yard.post(`/api/branches/${m.branchId}/slots`, { lorry_id: lorry.id, date: today(), time_window: '00:00-23:59', driver_id: driver.userId })).body;
    const order = (
      await k.c.post('/api/orders', { estimate_id: k.estimate.id, branch_id: m.branchId, requested_date: today(), delivery_method: 'ground', lines: [{ product_id: m.product('TRS-FL420-SG'), quantity: 360 }] })
    ).body;
    expect((await m.desk.post(`/api/orders/${order.id}/confirm`, { slot_id: slot.id })).status).toBe(200);
    await loadRunOf(yard, order.id);
    expect((await yard.post(`/api/orders/${order.id}/dispatch`)).status).toBe(200);
    expect((await (await login(driver.email)).post(`/api/orders/${order.id}/delivery`, { received_by: 'Site agent', lines: [{ line_id: order.lines[0].id, delivered_quantity: 350 }] })).status).toBe(200);
    const inv = await m.desk.post(`/api/orders/${order.id}/invoice`);
    expect(inv.body).toMatchObject({ basis: 'delivered', lines: [expect.objectContaining({ quantity: 350, net: 350 * 128 })] });
  });
});

describe('credit notes', () => {
  it('credits a shortage line by line, never more than invoiced, with its own number series', async () => {
    const m = await merchant();
    const k = await contractor(m);
    const { invoice } = await invoiced(m, k);
    const tiles = invoice.lines.find((l) => l.sku === 'TRS-FL420-SG')!;
    const res = await m.desk.post(`/api/invoices/${invoice.id}/credit-notes`, { reason: 'shortage', notes: '7 tiles short', lines: [{ invoice_line_id: tiles.id, quantity: 7 }] });
    expect(res.status).toBe(201);
    const after = invoiceSchema.parse(res.body);
    // 7 × 128p = 896p net, 20 % tax = 179.2p → 179p (rounded per line, half up).
    expect(after.credit_notes[0]).toMatchObject({ number: 'CN-000001', reason: 'shortage', subtotal: 896, tax_total: 179, total: 1075, refund: null });
    expect(after).toMatchObject({ credited: 1075, balance: invoice.total - 1075 });
    const over = await m.desk.post(`/api/invoices/${invoice.id}/credit-notes`, { reason: 'return', lines: [{ invoice_line_id: tiles.id, quantity: 354 }] });
    expect(over.status).toBe(422);
    expect(over.body.error.details[0]).toMatchObject({ path: 'lines.0.quantity', message: expect.stringMatching(/353/) });
    // Crediting the rest of every line clears the invoice exactly, rounding included.
    const rest = await m.desk.post(`/api/invoices/${invoice.id}/credit-notes`, { reason: 'return', lines: after.lines.map((l) => ({ invoice_line_id: l.id, quantity: l.quantity - l.credited_quantity })) });
    expect(rest.body).toMatchObject({ credited: invoice.total, balance: 0, status: 'credited' });
    expect(rest.body.credit_notes[1].number).toBe('CN-000002');
    expect((await k.c.post(`/api/invoices/${invoice.id}/credit-notes`, { reason: 'damage', lines: [{ invoice_line_id: tiles.id, quantity: 1 }] })).status).toBe(403);
  });
});

describe('card payments through the local payment fake', () => {
  it('pays an invoice by card on the hosted page: the signed event records exactly one payment', async () => {
    const m = await merchant();
    const k = await contractor(m);
    const { invoice } = await invoiced(m, k);
    const start = await k.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' });
    expect(start.status).toBe(201);
    const started = startPaymentResultSchema.parse(start.body);
    expect(started.status).toBe('open');
    expect(started.checkout_url).toMatch(new RegExp(`^${t.payments.url}/pay/cs_test_`));
    const paid = await payOnHostedPage(started.checkout_url!, CARD_OK);
    expect(paid.status).toBe(303);
    expect(paid.headers.location).toMatch(new RegExp(`^${t.url}/invoices/${invoice.id}\\?payment=done&session_id=cs_test_`));
    const after = invoiceSchema.parse((await k.c.get(`/api/invoices/${invoice.id}`)).body);
    expect(after).toMatchObject({ status: 'paid', paid: invoice.total, balance: 0 });
    expect(after.payments).toEqual([expect.objectContaining({ status: 'succeeded', amount: invoice.total, currency: 'GBP', checkout_url: null })]);
    expect(await t.db('payments').where({ invoice_id: invoice.id, status: 'succeeded' }).count({ n: '*' }).first()).toEqual({ n: 1 });
    const completed = t.payments.events.filter((e) => e.event.type === 'checkout.session.completed');
    expect(completed.at(-1)!.status).toBe(200);
    expect(t.mail.messages.some((x) => x.to.includes(k.email) && /Payment received/.test(x.subject))).toBe(true);
    expect(t.mail.messages.some((x) => x.to.includes(m.salesEmail) && /paid invoice/.test(x.subject))).toBe(true);
    // Paying again is refused; the paid page charges nothing more.
    expect((await k.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' })).body.error.code).toBe('nothing_to_pay');
    const again = await payOnHostedPage(started.checkout_url!, CARD_OK).catch(() => null);
    expect(again?.text ?? '').not.toMatch(/name="card_number"/);
    expect((await k.c.get(`/api/invoices/${invoice.id}`)).body.paid).toBe(invoice.total);
  });

  it('a declined card records the decline on the payment and leaves the invoice unpaid; a good card then pays it', async () => {
    const m = await merchant();
    const k = await contractor(m);
    const { invoice } = await invoiced(m, k);
    const { checkout_url } = (await k.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' })).body;
    const declined = await payOnHostedPage(checkout_url, CARD_DECLINED);
    expect(declined.status).toBe(402);
    expect(declined.text).toMatch(/Your card was declined/);
    const after = invoiceSchema.parse((await k.c.get(`/api/invoices/${invoice.id}`)).body);
    expect(after).toMatchObject({ status: 'unpaid', paid: 0 });
    expect(after.payments).toEqual([expect.objectContaining({ status: 'open', last_error: 'Your card was declined.' })]);
    expect((await payOnHostedPage(checkout_url, '4242 4242 4242 4241')).text).toMatch(/card number is incorrect/);
    expect((await payOnHostedPage(checkout_url, CARD_OK)).status).toBe(303);
    expect((await k.c.get(`/api/invoices/${invoice.id}`)).body).toMatchObject({ status: 'paid', paid: invoice.total });
    expect(await t.db('payments').where({ invoice_id: invoice.id }).count({ n: '*' }).first()).toEqual({ n: 1 });
  });

  it('pressing pay five times at once opens one checkout and charges once', async () => {
    const m = await merchant();
    const k = await contractor(m);
    const { invoice } = await invoiced(m, k);
    const presses = await Promise.all(Array.from({ length: 5 }, () => k.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' })));
    expect(presses.every((r) => r.status === 200 || r.status === 201)).toBe(true);
    expect(new Set(presses.map((r) => r.body.checkout_url)).size).toBe(1);
    expect(new Set(presses.map((r) => r.body.payment.id)).size).toBe(1);
    expect(await t.db('payments').where({ invoice_id: invoice.id }).count({ n: '*' }).first()).toEqual({ n: 1 });
    const url = presses[0].body.checkout_url as string;
    const [a, b] = await Promise.all([payOnHostedPage(url, CARD_OK), payOnHostedPage(url, CARD_OK)]);
    expect([a.status, b.status].sort()).toEqual([200, 303]);
    expect((await k.c.get(`/api/invoices/${invoice.id}`)).body.paid).toBe(invoice.total);
    const intents = t.payments.events.filter((e) => e.event.type === 'payment_intent.succeeded' && (e.event.data as { object: { metadata: { invoice_id: string } } }).object.metadata.invoice_id === String(invoice.id));
    expect(intents).toHaveLength(1);
  });

  it('refuses a tampered or unsigned event, and a replayed event changes nothing', async () => {
    const m = await merchant();
    const k = await contractor(m);
    const { invoice } = await invoiced(m, k);
    const { checkout_url } = (await k.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' })).body;
    await payOnHostedPage(checkout_url, CARD_OK);
    const delivered = t.payments.events.filter((e) => e.event.type === 'checkout.session.completed').at(-1)!;
    const signer = new Stripe('sk_test_unused', { telemetry: false });
    const secret = t.config.stripe.webhookSecret!;
    const tampered = delivered.payload.replace(`"amount_total": ${invoice.total}`, `"amount_total": ${invoice.total * 10}`);
    expect(tampered).not.toBe(delivered.payload);
    const goodHeader = signer.webhooks.generateTestHeaderString({ payload: delivered.payload, secret });
    const webhook = (payload: string, header?: string) => {
      const req = request(t.app).post('/api/payments/webhook').set('Content-Type', 'application/json');
      return (header ? req.set('Stripe-Signature', header) : req).send(payload);
    };
    const bad = await webhook(tampered, goodHeader);
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('bad_signature');
    expect((await webhook(delivered.payload)).status).toBe(400);
    expect((await webhook(delivered.payload, signer.webhooks.generateTestHeaderString({ payload: delivered.payload, secret: 'whsec_someone_else' }))).status).toBe(400);
    const replay = await webhook(delivered.payload, goodHeader);
    expect(replay.status).toBe(200);
    expect(replay.body).toEqual({ received: true, duplicate: true });
    // A new event id for the same session (a provider retry) records nothing either.
    const retry = delivered.payload.replace(/"id": "evt_[^"]+"/, '"id": "evt_test_retry1"');
    expect((await webhook(retry, signer.webhooks.generateTestHeaderString({ payload: retry, secret }))).body).toEqual({ received: true, duplicate: false });
    const after = (await k.c.get(`/api/invoices/${invoice.id}`)).body;
    expect(after.paid).toBe(invoice.total);
    expect(after.payments).toHaveLength(1);
  });

  it('refunds a credit note on a card-paid invoice through the provider, once', async () => {
    const m = await merchant();
    const k = await contractor(m);
    const { invoice } = await invoiced(m, k);
    await payOnHostedPage((await k.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' })).body.checkout_url, CARD_OK);
    const tiles = invoice.lines.find((l) => l.sku === 'TRS-FL420-SG')!;
    const res = await m.desk.post(`/api/invoices/${invoice.id}/credit-notes`, { reason: 'damage', lines: [{ invoice_line_id: tiles.id, quantity: 10 }] });
    expect(res.status).toBe(201);
    // 10 × 128p = 1280p + 256p tax = 1536p back to the card.
    expect(res.body.credit_notes[0].refund).toEqual({ status: 'succeeded', amount: 1536, last_error: null });
    expect(res.body).toMatchObject({ paid: invoice.total - 1536, credited: 1536, balance: 0, status: 'paid' });
    const retry = await m.desk.post(`/api/credit-notes/${res.body.credit_notes[0].id}/refund`);
    expect(retry.body.paid).toBe(invoice.total - 1536);
  });

  it('keeps payments to the invoice’s contractor', async () => {
    const m = await merchant();
    const k = await contractor(m);
    const { invoice } = await invoiced(m, k);
    expect((await m.desk.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' })).status).toBe(403);
    expect((await k.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'cash' })).status).toBe(422);
    const stranger = await contractor(m);
    expect((await stranger.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' })).status).toBe(404);
    expect(await t.db('payments').where({ invoice_id: invoice.id }).first()).toBeUndefined();
  });
});

describe('no role reaches another organisation’s invoices', () => {
  for (const role of ROLES) {
    it(`${role}: reading, printing, crediting and paying another firm’s invoice are refused`, async () => {
      const m = await merchant();
      const k = await contractor(m);
      const { invoice } = await invoiced(m, k);
      const before = await t.db('invoices').where({ id: invoice.id }).first();
      const actor = await makeOrgWithUser(t.db, kindOfRole(role), role);
      const c = await login(actor.email);
      const attempts = [
        await c.get(`/api/invoices/${invoice.id}`),
        await c.get(`/api/invoices/${invoice.id}/print`),
        await c.get(`/api/invoices/${invoice.id}/export.xlsx`),
        await c.post(`/api/invoices/${invoice.id}/credit-notes`, { reason: 'damage', lines: [{ invoice_line_id: invoice.lines[0].id, quantity: 1 }] }),
        await c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' }),
        await c.send('put', `/api/accounts/${k.organisationId}`, { terms_days: 60 }),
      ];
      for (const res of attempts) expect([403, 404], `${role}: ${res.status} ${JSON.stringify(res.body.error)}`).toContain(res.status);
      const list = await c.get('/api/invoices');
      if (list.status === 200) expect(list.body.invoices).toEqual([]);
      expect(await t.db('invoices').where({ id: invoice.id }).first()).toEqual(before);
      expect(await t.db('payments').where({ invoice_id: invoice.id }).first()).toBeUndefined();
    });
  }
});
