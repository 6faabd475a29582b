import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/test-app';
import { contractorWithEstimate, merchantWithCatalogue, orderBody } from '../setup/order-scenario';
import { signIn } from '../setup/scenario';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

type Book = { orders: { id: number; status: string; po_reference: string; line_count: number; branch: { name: string }; contractor: { name: string } }[]; total: number };

/**
 * The order book is answered from memory until something it shows changes. Each check changes the
 * book a different way — through the API, and behind the API's back straight in the database — and
 * expects the very next read to show it.
 */
describe('the order book never shows a stale answer', () => {
  it('shows a new order, a confirmation, a rename and a direct database change on the next read', async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    const desk = await signIn(t.app, m.salesEmail);
    const book = async (query = 'sort=placed_at&dir=desc') => (await desk.get(`/api/orders?${query}`)).body as Book;

    expect((await book()).total).toBe(0);
    const first = (await k.c.post('/api/orders', orderBody(k, m, { po_reference: 'PO-FRESH-1' }))).body as { id: number };
    const afterPlacing = await book();
    expect(afterPlacing.orders.map((o) => o.po_reference)).toEqual(['PO-FRESH-1']);
    const asked = await book('statuses=sent&sort=placed_at&dir=desc');
    expect(asked.total).toBe(1);

    expect((await desk.post(`/api/orders/${first.id}/confirm`, {})).status).toBe(200);
    expect((await book()).orders[0].status).toBe('confirmed');
    expect((await book('statuses=sent&sort=placed_at&dir=desc')).total).toBe(0);

    // The contractor's side of the same order moves too.
    const mine = (await k.c.get('/api/orders?sort=placed_at&dir=desc')).body as Book;
    expect(mine.orders[0].status).toBe('confirmed');

    await t.db('branches').where({ id: m.branchId }).update({ name: 'Renamed Yard' });
    expect((await book()).orders[0].branch.name).toBe('Renamed Yard');
    await t.db('organisations').where({ id: k.organisationId }).update({ name: 'Renamed Roofing' });
    expect((await book()).orders[0].contractor.name).toBe('Renamed Roofing');

    await t.db('orders').where({ id: first.id }).update({ po_reference: 'PO-EDITED' });
    expect((await book()).orders[0].po_reference).toBe('PO-EDITED');

    const lines = (await book()).orders[0].line_count;
    const last = (await t.db('order_lines').where({ order_id: first.id }).max({ id: 'id' }).first()) as { id: number };
    await t.db('order_lines').where({ id: last.id }).delete();
    expect((await book()).orders[0].line_count).toBe(lines - 1);
  });

  it('tags each page so an unchanged book answers 304, and a changed one a new page', async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    const placed = (await k.c.post('/api/orders', orderBody(k, m, { po_reference: 'PO-TAG' }))).body as { id: number };
    const desk = await signIn(t.app, m.salesEmail);
    const first = await desk.get('/api/orders?sort=placed_at&dir=desc');
    const tag = first.headers.etag as string;
    expect(tag).toMatch(/^W\/"[0-9a-f]+-[A-Za-z0-9+/]{27}"$/);
    const again = await desk.agent.get('/api/orders?sort=placed_at&dir=desc').set('If-None-Match', tag);
    expect(again.status).toBe(304);
    expect((await desk.post(`/api/orders/${placed.id}/confirm`, {})).status).toBe(200);
    const changed = await desk.agent.get('/api/orders?sort=placed_at&dir=desc').set('If-None-Match', tag);
    expect(changed.status).toBe(200);
    expect(changed.headers.etag).not.toBe(tag);
    expect(changed.body.orders[0].status).toBe('confirmed');
  });

  it('answers a query text asked before as the first time, and refuses a bad one every time', async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    await k.c.post('/api/orders', orderBody(k, m, { po_reference: 'PO-KEPT' }));
    const desk = await signIn(t.app, m.salesEmail);
    const q = '/api/orders?statuses=sent&sort=placed_at&dir=desc&page_size=10';
    const first = await desk.get(q);
    const second = await desk.get(q);
    expect(second.status).toBe(200);
    expect(second.body).toEqual(first.body);
    expect((second.body as { page_size: number }).page_size).toBe(10);
    expect(second.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(Number(second.headers['content-length'])).toBe(Buffer.byteLength(JSON.stringify(first.body)));
    expect(second.headers.etag).toBe(first.headers.etag);
    // Another text is parsed on its own: another page size, another page.
    expect(((await desk.get(q.replace('page_size=10', 'page_size=5'))).body as { page_size: number }).page_size).toBe(5);

    const head = await desk.agent.head(q);
    expect(head.status).toBe(200);
    expect(head.headers.etag).toBe(first.headers.etag);
    const notModified = await desk.agent.get(q).set('If-None-Match', first.headers.etag as string);
    expect(notModified.status).toBe(304);
    expect(notModified.headers['content-type']).toBeUndefined();
    expect(notModified.text).toBe('');

    for (const bad of ['page_size=500', 'q=%00', 'branch_id=0x1']) {
      for (let i = 0; i < 2; i++) {
        const refused = await desk.get(`/api/orders?${bad}`);
        expect(refused.status, bad).toBe(422);
        expect(JSON.stringify(refused.body), bad).toContain(bad.split('=')[0]);
      }
    }
  });

  it("keeps one merchant's reads apart from another's", async () => {
    const a = await merchantWithCatalogue(t);
    const b = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, a);
    await k.c.post('/api/orders', orderBody(k, a, { po_reference: 'PO-ONLY-A' }));
    const deskA = await signIn(t.app, a.salesEmail);
    const deskB = await signIn(t.app, b.salesEmail);
    const q = '/api/orders?sort=placed_at&dir=desc';
    expect((await deskA.get(q)).body.total).toBe(1);
    expect((await deskB.get(q)).body.total).toBe(0);
    expect((await deskA.get(q)).body.total).toBe(1);
  });
});
