import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sessionAnswerSchema } from '../../shared/schemas/auth.schema';
import { contractorWithEstimate, mailTo, merchantWithCatalogue, orderBody } from '../setup/order-scenario';
import { signIn } from '../setup/scenario';
import { createTestApp, type TestApp } from '../setup/test-app';

// The currency is configured once (CURRENCY, an ISO 4217 code; GBP when unset): the session names it
// to the browser, and the e-mails write amounts in it through the one money formatter.
let euro: TestApp;
let pounds: TestApp;
let yen: TestApp;
beforeAll(async () => {
  [euro, pounds, yen] = await Promise.all([createTestApp({ CURRENCY: 'eur' }), createTestApp(), createTestApp({ CURRENCY: 'JPY' })]);
});
afterAll(async () => Promise.all([euro?.close(), pounds?.close(), yen?.close()]));

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

  // The yen has no minor unit (ISO 4217 exponent 0): a pack at 128 in the database is ¥128, written 128.
  it('writes and reads a price list file in whole yen when the currency has no decimals', async () => {
    const m = await merchantWithCatalogue(yen);
    const desk = await signIn(yen.app, m.salesEmail);
    const csv = (await desk.get(`/api/branches/${m.branchId}/price-list?format=csv`)).text;
    expect(csv).toMatch(/\r\nTRS-FL420-SG,.*,20,128\r\n/);
    const upload = async (body: string) =>
      desk.agent
        .post(`/api/branches/${m.branchId}/price-list`)
        .set('X-CSRF-Token', await desk.csrf())
        .set('Content-Type', 'text/csv')
        .send(body);
    const tilePrice = async () =>
      (
        await yen
          .db('branch_products')
          .where({ branch_id: m.branchId, product_id: m.product('TRS-FL420-SG') })
          .first('pack_price')
      ).pack_price as number;
    const cheaper = await upload('sku,price\r\nTRS-FL420-SG,"1,150"\r\n');
    expect(cheaper.status, JSON.stringify(cheaper.body)).toBe(200);
    expect(await tilePrice()).toBe(1_150);
    const pence = await upload('sku,price\r\nTRS-FL420-SG,11.50\r\n');
    expect(pence.status).toBe(422);
    expect(pence.body.error.details).toEqual([{ row: 2, column: 'price', message: 'must be a whole number (11.5)' }]);
    expect(await tilePrice()).toBe(1_150);
  });
});
