import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays, addMonths } from '../../shared/domain/business-calendar';
import { DEMO_CATALOGUES } from '../../seeds/02-catalogue';
import { createTestApp, type TestApp } from '../setup/test-app';
import { signIn } from '../setup/scenario';
import { contractorWithEstimate, merchantWithCatalogue, orderBody } from '../setup/order-scenario';

let t: TestApp;
let world: { m: Awaited<ReturnType<typeof merchantWithCatalogue>>; k: Awaited<ReturnType<typeof contractorWithEstimate>>; orderId: number };
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
  const m = await merchantWithCatalogue(t, DEMO_CATALOGUES[0]);
  const k = await contractorWithEstimate(t, m);
  const o = await k.c.post('/api/orders', orderBody(k, m));
  expect(o.status, JSON.stringify(o.body)).toBe(201);
  world = { m, k, orderId: o.body.id };
});
afterAll(async () => t.close());

const today = () => t.config.calendar.today();
const counts = async () => ({
  orders: Number((await t.db('orders').count({ n: '*' }).first())?.n),
  quotes: Number((await t.db('quote_requests').count({ n: '*' }).first())?.n),
  proposals: Number((await t.db('order_proposals').count({ n: '*' }).first())?.n),
});

describe('delivery days: today up to two years ahead, by the business calendar', () => {
  const tooFar = () => addDays(addMonths(today(), 24), 1);
  for (const [label, date] of [
    ['9999-12-31', () => '9999-12-31'],
    ['the day after two years', tooFar],
    ['yesterday', () => addDays(today(), -1)],
  ] as const) {
    it(`refuses ${label} on a new order, an amendment, a quote request and a desk’s offer, storing nothing`, async () => {
      const { m, k, orderId } = world;
      const before = await counts();
      const order = await t.db('orders').where({ id: orderId }).first();
      const placed = await k.c.post('/api/orders', orderBody(k, m, { requested_date: date() }));
      expect(placed.status).toBe(422);
      expect(placed.body.error.details[0].path).toBe('requested_date');
      const amended = await k.c.patch(`/api/orders/${orderId}`, { revision: order.revision, requested_date: date() });
      expect(amended.status).toBe(422);
      expect(amended.body.error.details[0].path).toBe('requested_date');
      const quote = await k.c.post('/api/quote-requests', { estimate_id: k.estimate.id, branch_ids: [m.branchId], requested_date: date(), time_window: '07:00-11:00', delivery_method: 'ground' });
      expect(quote.status).toBe(422);
      expect(quote.body.error.details[0].path).toBe('requested_date');
      const desk = await signIn(t.app, m.salesEmail);
      const offer = await desk.post(`/api/orders/${orderId}/proposals`, { revision: order.revision, proposed_date: date() });
      expect(offer.status).toBe(422);
      expect(offer.body.error.details[0].path).toBe('proposed_date');
      expect(await counts()).toEqual(before);
      expect(await t.db('orders').where({ id: orderId }).first()).toEqual(order);
    });
  }

  it('takes the last day of the window', async () => {
    const { m, k } = world;
    const res = await k.c.post('/api/orders', orderBody(k, m, { requested_date: addMonths(today(), 24) }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  });
});

describe('control characters in search text', () => {
  for (const q of ['%00', 'a%00b', '%01', '%1B%5B2J', '%7F', 'Ferncombe%0A']) {
    it(`refuses q=${q} with 422 naming the field, on the order book and the site list`, async () => {
      for (const path of ['/api/orders', '/api/projects', '/api/quote-requests']) {
        const res = await world.k.c.get(`${path}?q=${q}`);
        expect(res.status, path).toBe(422);
        expect(res.body.error.details[0]).toEqual({ path: 'q', message: 'must not contain control characters' });
      }
    });
  }

  it('still searches plain text, accents and emoji', async () => {
    for (const q of ['Ferncombe', 'Llŷn', '🏠', 'O%27Brien', '50%25']) expect((await world.k.c.get(`/api/orders?q=${q}`)).status).toBe(200);
  });
});

describe('ids are plain decimal integers', () => {
  it('reads an order by its plain id, and answers 404 to every other spelling of it', async () => {
    const { k, orderId } = world;
    expect((await k.c.get(`/api/orders/${orderId}`)).status).toBe(200);
    for (const spelt of [
      `0x${orderId.toString(16)}`,
      `${orderId}e0`,
      `%20${orderId}`,
      `${orderId}%20`,
      `+${orderId}`,
      `%2B${orderId}`,
      `0${orderId}`,
      `${orderId}.0`,
      `${orderId}.`,
      '0',
      '-1',
      'Infinity',
      'NaN',
      '1_0',
      '99999999999999999999',
    ]) {
      const res = await k.c.get(`/api/orders/${spelt}`);
      expect(res.status, spelt).toBe(404);
    }
    expect((await k.c.patch(`/api/orders/0x${orderId.toString(16)}`, { revision: 1, notes: 'x' })).status).toBe(404);
  });

  it('refuses ids in a body that are not whole numbers with 422 naming the field', async () => {
    const { m, k } = world;
    const before = await counts();
    for (const bad of ['1', '0x1', 1.5, -1, 0, null, true, [1], { id: 1 }, 1e21, 'NaN']) {
      const res = await k.c.post('/api/orders', orderBody(k, m, { estimate_id: bad }));
      expect(res.status, JSON.stringify(bad)).toBe(422);
      expect(res.body.error.details[0].path).toBe('estimate_id');
    }
    expect(await counts()).toEqual(before);
  });

  it('refuses a query id that is not a plain integer', async () => {
    const res = await world.k.c.get('/api/orders?project_id=0x1');
    expect(res.status).toBe(422);
    expect(res.body.error.details[0].path).toBe('project_id');
  });
});
