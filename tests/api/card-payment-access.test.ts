import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { invoiceSchema } from '../../shared/schemas/invoice.schema';
import { returnBase } from '../../server/http/return-origin';
import { createTestApp, type TestApp } from '../setup/test-app';
import { contractorWithEstimate, merchantWithCatalogue, orderBody, type TestMerchant } from '../setup/order-scenario';
import { signIn } from '../setup/scenario';
import type { Client } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000', APP_ORIGINS: 'http://desk.tollerbeck.test:8080' });
});
afterAll(async () => t.close());

/** A confirmed order invoiced to the contractor, with the contractor on 30-day terms when `account`. */
async function invoiced(m: TestMerchant, account?: { card_payments?: boolean }) {
  const k = await contractorWithEstimate(t, m);
  const desk = await signIn(t.app, m.ownerEmail);
  const placed = await k.c.post('/api/orders', orderBody(k, m));
  if (account) expect((await desk.send('put', `/api/accounts/${k.organisationId}`, { terms_days: 30, ...account })).status).toBe(200);
  expect((await desk.post(`/api/orders/${placed.body.id}/confirm`, {})).status).toBe(200);
  const inv = await desk.post(`/api/orders/${placed.body.id}/invoice`);
  expect(inv.status).toBe(201);
  return { k, desk, invoice: invoiceSchema.parse((await k.c.get(`/api/invoices/${inv.body.id}`)).body) };
}

/** Starts a card payment as a browser at `origin` would, and reads where the payment page sends the payer back. */
async function startFrom(c: Client, invoiceId: number, origin: string) {
  const token = await c.csrf();
  const res = await c.agent.post(`/api/invoices/${invoiceId}/payments`).set('X-CSRF-Token', token).set('Host', new URL(origin).host).set('Origin', origin).send({ method: 'card' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const url = new URL(res.body.checkout_url as string);
  const paid = await request(url.origin).post(url.pathname).type('form').send({ card_number: '4242 4242 4242 4242', expiry: '12/34', cvc: '123', name: 'Tamsin Orrell' });
  return String(paid.headers.location);
}

describe('the card payment page sends the payer back to the address they paid from', () => {
  it('returns to the address the browser used, outside production', async () => {
    const m = await merchantWithCatalogue(t);
    const { k, invoice } = await invoiced(m);
    expect(await startFrom(k.c, invoice.id, 'http://roofs.lan:3000')).toMatch(new RegExp(`^http://roofs\\.lan:3000/invoices/${invoice.id}\\?payment=done`));
  });

  it('returns to one of the allowed origins, and to APP_URL for any other address', async () => {
    const base = { appUrl: 'https://app.ridgeload.test', allowedOrigins: ['https://app.ridgeload.test', 'https://desk.tollerbeck.test'], isProduction: true };
    const req = (headers: Record<string, string>) => ({ get: (h: string) => headers[h.toLowerCase()], protocol: 'https' }) as never;
    expect(returnBase(req({ origin: 'https://desk.tollerbeck.test', host: 'desk.tollerbeck.test' }), base)).toBe('https://desk.tollerbeck.test');
    expect(returnBase(req({ referer: 'https://desk.tollerbeck.test/invoices/4', host: 'desk.tollerbeck.test' }), base)).toBe('https://desk.tollerbeck.test');
    // In production the address used is not enough: it must be listed.
    expect(returnBase(req({ origin: 'https://elsewhere.test', host: 'elsewhere.test' }), base)).toBe('https://app.ridgeload.test');
    expect(returnBase(req({ host: 'app.ridgeload.test' }), base)).toBe('https://app.ridgeload.test');

    const m = await merchantWithCatalogue(t);
    const { k, invoice } = await invoiced(m);
    // A page on another site cannot choose where the payer lands.
    const token = await k.c.csrf();
    const res = await k.c.agent.post(`/api/invoices/${invoice.id}/payments`).set('X-CSRF-Token', token).set('Origin', 'http://elsewhere.test').send({ method: 'card' });
    expect(res.status).toBe(201);
    const url = new URL(res.body.checkout_url as string);
    const paid = await request(url.origin).post(url.pathname).type('form').send({ card_number: '4242 4242 4242 4242', expiry: '12/34', cvc: '123', name: 'Tamsin Orrell' });
    expect(String(paid.headers.location).startsWith(`${t.config.appUrl}/invoices/${invoice.id}`)).toBe(true);
  });

  it('honours APP_ORIGINS', async () => {
    const m = await merchantWithCatalogue(t);
    const { k, invoice } = await invoiced(m);
    const token = await k.c.csrf();
    const res = await k.c.agent.post(`/api/invoices/${invoice.id}/payments`).set('X-CSRF-Token', token).set('Origin', 'http://desk.tollerbeck.test:8080').send({ method: 'card' });
    expect(res.status).toBe(201);
    const url = new URL(res.body.checkout_url as string);
    const paid = await request(url.origin).post(url.pathname).type('form').send({ card_number: '4242 4242 4242 4242', expiry: '12/34', cvc: '123', name: 'Tamsin Orrell' });
    expect(String(paid.headers.location)).toMatch(/^http:\/\/desk\.tollerbeck\.test:8080\/invoices\//);
  });
});

describe('a contractor on account may pay an open invoice by card', () => {
  it('shows card payment on an account invoice and takes it', async () => {
    const m = await merchantWithCatalogue(t);
    const { k, invoice } = await invoiced(m, {});
    expect(invoice).toMatchObject({ pay_by: 'account', card_payment: true });
    const res = await k.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.checkout_url).toMatch(/\/pay\/cs_test_/);
  });

  it('refuses card payment where the merchant turned it off for the account, and says so', async () => {
    const m = await merchantWithCatalogue(t);
    const { k, desk, invoice } = await invoiced(m, { card_payments: false });
    expect(invoice.card_payment).toBe(false);
    const res = await k.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('card_payment_off');
    const accounts = (await desk.get('/api/accounts')).body.accounts;
    expect(accounts).toEqual([expect.objectContaining({ contractor: expect.objectContaining({ id: k.organisationId }), terms_days: 30, card_payments: false })]);
    // Turned on again, the same invoice can be paid by card.
    expect((await desk.send('put', `/api/accounts/${k.organisationId}`, { terms_days: 30, card_payments: true })).body.card_payments).toBe(true);
    expect((await k.c.post(`/api/invoices/${invoice.id}/payments`, { method: 'card' })).status).toBe(201);
  });
});
