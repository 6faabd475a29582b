import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays, nextWorkingDay } from '../../shared/domain/business-calendar';
import { DEMO_CATALOGUES } from '../../seeds/02-catalogue';
import { createTestApp, type TestApp } from '../setup/test-app';
import { signIn } from '../setup/scenario';
import { contractorWithEstimate, merchantWithCatalogue, orderBody } from '../setup/order-scenario';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

async function lorryAndSlot(m: Awaited<ReturnType<typeof merchantWithCatalogue>>, date: string) {
  const yard = await signIn(t.app, m.dispatcherEmail);
  const l = await yard.post(`/api/branches/${m.branchId}/lorries`, { name: 'Rigid', registration: `RL-${m.branchId}X`, payload_kg: 12000, pallet_slots: 10, has_crane: true, crane_max_kg: 1500 });
  expect(l.status, JSON.stringify(l.body)).toBe(201);
  const s = await yard.post(`/api/branches/${m.branchId}/slots`, { lorry_id: l.body.id, date, time_window: '07:30-12:00' });
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  return { lorryId: l.body.id as number, slotId: s.body.id as number };
}

describe('ids in a body must be within the caller’s reach', () => {
  it('refuses a desk’s offer that names another merchant’s delivery slot, storing nothing', async () => {
    const a = await merchantWithCatalogue(t, DEMO_CATALOGUES[0]);
    const b = await merchantWithCatalogue(t, DEMO_CATALOGUES[1]);
    const day = nextWorkingDay(addDays(t.config.calendar.today(), 5));
    const theirs = await lorryAndSlot(b, day);
    const ours = await lorryAndSlot(a, day);
    const k = await contractorWithEstimate(t, a);
    const order = await k.c.post('/api/orders', orderBody(k, a));
    expect(order.status, JSON.stringify(order.body)).toBe(201);
    const desk = await signIn(t.app, a.salesEmail);

    const before = await t.db('orders').where({ id: order.body.id }).first();
    const res = await desk.post(`/api/orders/${order.body.id}/proposals`, { revision: 1, message: 'Their lorry', proposed_slot_id: theirs.slotId });
    expect(res.status).toBe(422);
    expect(res.body.error.details).toEqual([{ path: 'proposed_slot_id', message: expect.stringMatching(/is not a delivery slot of/) }]);
    expect(await t.db('order_proposals').where({ order_id: order.body.id })).toEqual([]);
    expect(await t.db('orders').where({ id: order.body.id }).first()).toEqual(before);

    const missing = await desk.post(`/api/orders/${order.body.id}/proposals`, { revision: 1, proposed_slot_id: 999_999 });
    expect(missing.status).toBe(422);

    const ok = await desk.post(`/api/orders/${order.body.id}/proposals`, { revision: 1, message: 'Our lorry', proposed_slot_id: ours.slotId });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
  });
});
