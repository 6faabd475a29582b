import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/test-app';
import { contractorWithEstimate, merchantWithCatalogue, orderBody } from '../setup/order-scenario';
import { inDays, signIn } from '../setup/scenario';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

async function yardWithLorry(registration: string) {
  const m = await merchantWithCatalogue(t);
  const yard = await signIn(t.app, m.dispatcherEmail);
  const lorry = await yard.post(`/api/branches/${m.branchId}/lorries`, { registration, payload_kg: 18_000, pallet_slots: 14 });
  expect(lorry.status).toBe(201);
  const gen = await yard.post(`/api/branches/${m.branchId}/slots/generate`, { from: inDays(1), to: inDays(14), windows: ['07:30-12:00'] });
  expect(gen.status).toBe(201);
  const slots = await t.db('delivery_slots').where({ lorry_id: lorry.body.id }).orderBy('date');
  return { m, yard, lorryId: lorry.body.id as number, slots };
}

describe('taking a lorry out of service', () => {
  it('removes its coming empty runs with it, and puts it back when restored', async () => {
    const { m, yard, lorryId, slots } = await yardWithLorry('RL-AR01');
    expect(slots.length).toBeGreaterThan(0);
    const res = await yard.delete(`/api/lorries/${lorryId}`);
    expect(res.status).toBe(200);
    expect(res.body.archived_at).toEqual(expect.any(String));
    expect(await t.db('delivery_slots').where({ lorry_id: lorryId }).count({ n: '*' }).first()).toEqual({ n: 0 });
    expect((await yard.get(`/api/branches/${m.branchId}/lorries`)).body.lorries).toEqual([]);
    expect((await yard.get(`/api/branches/${m.branchId}/lorries?archived=true`)).body.lorries.map((l: { id: number }) => l.id)).toEqual([lorryId]);

    const back = await yard.post(`/api/lorries/${lorryId}/restore`, {});
    expect(back.status).toBe(200);
    expect(back.body.archived_at).toBeNull();
    expect((await yard.get(`/api/branches/${m.branchId}/lorries`)).body.lorries.map((l: { id: number }) => l.id)).toEqual([lorryId]);
  });

  it('refuses while a coming run still has an order to deliver, naming the run, and changes nothing', async () => {
    const { m, yard, lorryId, slots } = await yardWithLorry('RL-AR02');
    const k = await contractorWithEstimate(t, m);
    const order = (await k.c.post('/api/orders', orderBody(k, m, { requested_date: slots[0].date }))).body as { id: number };
    const desk = await signIn(t.app, m.salesEmail);
    expect((await desk.post(`/api/orders/${order.id}/confirm`, { slot_id: slots[0].id })).status).toBe(200);

    const res = await yard.delete(`/api/lorries/${lorryId}`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('lorry_booked');
    expect(res.body.error.message).toContain('RL-AR02');
    expect(res.body.error.details).toEqual([expect.objectContaining({ slot_id: slots[0].id, date: slots[0].date, message: expect.stringContaining('1 order to deliver') })]);
    expect((await t.db('lorries').where({ id: lorryId }).first()).archived_at).toBeNull();
    expect(await t.db('delivery_slots').where({ lorry_id: lorryId }).count({ n: '*' }).first()).toEqual({ n: slots.length });
  });

  it('takes no new booking on a run it keeps because a delivery on it is done', async () => {
    const { m, yard, lorryId, slots } = await yardWithLorry('RL-AR05');
    const desk = await signIn(t.app, m.salesEmail);
    const k = await contractorWithEstimate(t, m);
    const kept = (await k.c.post('/api/orders', orderBody(k, m, { requested_date: slots[0].date }))).body as { id: number };
    expect((await desk.post(`/api/orders/${kept.id}/confirm`, { slot_id: slots[0].id })).status).toBe(200);
    // The run's one order is delivered, so archiving keeps the run as the record.
    await t.db('slot_bookings').where({ order_id: kept.id }).update({ delivered_at: new Date().toISOString(), received_by: 'Site agent' });
    expect((await yard.delete(`/api/lorries/${lorryId}`)).status).toBe(200);
    expect(await t.db('delivery_slots').where({ id: slots[0].id }).first()).toBeDefined();
    const late = (await k.c.post('/api/orders', orderBody(k, m, { requested_date: slots[0].date }))).body as { id: number };
    const refused = await desk.post(`/api/orders/${late.id}/confirm`, { slot_id: slots[0].id });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('lorry_archived');
    expect((await t.db('orders').where({ id: late.id }).first()).status).toBe('sent');
  });

  it('is for the yard and the owner only, and never reaches another merchant’s lorry', async () => {
    const { m, lorryId } = await yardWithLorry('RL-AR03');
    const desk = await signIn(t.app, m.salesEmail);
    expect((await desk.delete(`/api/lorries/${lorryId}`)).status).toBe(403);
    expect((await desk.post(`/api/lorries/${lorryId}/restore`, {})).status).toBe(403);
    const other = await yardWithLorry('RL-AR04');
    expect((await other.yard.delete(`/api/lorries/${lorryId}`)).status).toBe(404);
    expect((await other.yard.post(`/api/lorries/${lorryId}/restore`, {})).status).toBe(404);
    expect((await t.db('lorries').where({ id: lorryId }).first()).archived_at).toBeNull();
  });
});
