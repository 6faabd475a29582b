import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sessionAnswerSchema } from '../../shared/schemas/auth.schema';
import { contractorWithEstimate, mailTo, merchantWithCatalogue, orderBody } from '../setup/order-scenario';
import { createTestApp, type TestApp } from '../setup/test-app';

// The currency is configured once (CURRENCY, an ISO 4217 code; GBP when unset): the session names it
// to the browser, and the e-mails write amounts in it through the one money formatter.
let euro: TestApp;
let pounds: TestApp;
beforeAll(async () => {
  [euro, pounds] = await Promise.all([createTestApp({ CURRENCY: 'eur' }), createTestApp()]);
});
afterAll(async () => Promise.all([euro?.close(), pounds?.close()]));

describe('the configured currency', () => {
  it('travels with the session, upper-cased, and is GBP when nothing is configured', async () => {
    const m = await merchantWithCatalogue(euro);
    const k = await contractorWithEstimate(euro, m);
    const answer = sessionAnswerSchema.parse((await k.c.get('/api/auth/session')).body);
    expect(answer.session?.currency).toBe('EUR');
    expect((await k.c.get('/api/auth/me')).body.currency).toBe('EUR');

    const home = await contractorWithEstimate(pounds, await merchantWithCatalogue(pounds));
    expect(sessionAnswerSchema.parse((await home.c.get('/api/auth/session')).body).session?.currency).toBe('GBP');
  });

  it('writes the amounts of an order e-mail in the configured currency', async () => {
    const m = await merchantWithCatalogue(euro);
    const k = await contractorWithEstimate(euro, m);
    const placed = await k.c.post('/api/orders', orderBody(k, m));
    expect(placed.status, JSON.stringify(placed.body)).toBe(201);
    const subtotal = placed.body.subtotal as number;
    const mail = await mailTo(euro, k.email, /sent to/);
    const euros = new Intl.NumberFormat('en-GB', { style: 'currency', currency: 'EUR' }).format(subtotal / 100);
    expect(mail.text).toContain(`(${euros} before tax)`);
    expect(mail.text).not.toContain('£');
  });
});
