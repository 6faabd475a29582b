import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, kindOfRole } from '../../shared/domain/roles';
import { orderDetailSchema } from '../../shared/schemas/order.schema';
import { loadingSheetSchema, slotDaySchema } from '../../shared/schemas/slot.schema';
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
const DAY = inDays(3);

// A full pallet of this tile: 180 tiles × 4.4 kg + a 25 kg timber pallet = 817 kg
// (the tile's own figures from the demo catalogue; 25 kg tare is common practice for a timber pallet).
const TILES_PER_PALLET = 180;
const FULL_PALLET_KG = Math.round((180 * 4.4 + 25) * 10) / 10; // 817 kg

const login = (email: string) => signIn(t.app, email);

async function merchant() {
  const owner = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
  const installed = await installCatalogue(t.db, owner.organisationId, [{ id: owner.branchId!, priceFactor: 1, stockFactor: 1 }], TOLLERBECK);
  const sales = await makeUser(t.db, owner.organisationId, 'merchant_sales');
  const dispatcher = await makeUser(t.db, owner.organisationId, 'merchant_dispatcher');
  const driver = await makeUser(t.db, owner.organisationId, 'driver');
  const otherDriver = await makeUser(t.db, owner.organisationId, 'driver');
  const yard = await login(dispatcher.email);
  return {
    organisationId: owner.organisationId,
    branchId: owner.branchId!,
    ownerEmail: owner.email,
    salesEmail: sales.email,
    driverEmail: driver.email,
    driverId: driver.userId,
    otherDriverEmail: otherDriver.email,
    yard,
    product: (sku: string) => installed.productIds.get(sku)!,
    systemId: installed.systemIds[0].id,
  };
}
type Merchant = Awaited<ReturnType<typeof merchant>>;

async function lorryWithSlot(m: Merchant, lorry: Record<string, unknown>, date = DAY, window = '07:30-12:00') {
  const l = await m.yard.post(`/api/branches/${m.branchId}/lorries`, { name: 'Test rigid', ...lorry });
  expect(l.status, JSON.stringify(l.body)).toBe(201);
  const s = await m.yard.post(`/api/branches/${m.branchId}/slots`, { lorry_id: l.body.id, date, time_window: window });
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  return { lorry: l.body, slot: s.body };
}

async function contractor(m: Merchant, access: Record<string, string> = {}) {
  const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator');
  const c = await login(u.email);
  const p = await c.post('/api/projects', {
    name: 'Ferncombe Mews',
    site_address: '1–4 Ferncombe Mews, Tollerbeck',
    contact_name: 'Lowri Haskett',
    contact_phone: '07700 900 301',
    crane_lift: 'allowed',
    overhead_lines: 'present',
    set_down_place: 'Verge by plot 1',
    access_notes: 'Gate opens 07:30',
    ...access,
  });
  const token = await c.csrf();
  await c.agent.post(`/api/projects/${p.body.id}/schedule`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(GABLE);
  const e = await c.post(`/api/projects/${p.body.id}/estimates`, { system_id: m.systemId });
  expect(e.status).toBe(201);
  return { ...u, c, estimate: e.body };
}

/** An order of whole pallets of tiles only, so its load is easy to work out by hand. */
async function tileOrder(m: Merchant, k: Awaited<ReturnType<typeof contractor>>, pallets: number, method: 'ground' | 'roof' = 'ground') {
  const res = await k.c.post('/api/orders', {
    estimate_id: k.estimate.id,
    branch_id: m.branchId,
    requested_date: DAY,
    delivery_method: method,
    lines: [{ product_id: m.product('TRS-FL420-SG'), quantity: pallets * TILES_PER_PALLET }],
  });
  expect(res.status).toBe(201);
  return res.body as { id: number; lines: { id: number; quantity: number }[] };
}

describe('lorries and the slot calendar', () => {
  it('adds lorries with their capacity and crane, refuses a duplicate registration, a crane without a limit and the order desk', async () => {
    const m = await merchant();
    const ok = await m.yard.post(`/api/branches/${m.branchId}/lorries`, { registration: 'rl-ab12', payload_kg: 14000, pallet_slots: 12, has_crane: true, crane_max_kg: 1200 });
    expect(ok.status).toBe(201);
    expect(ok.body).toMatchObject({ registration: 'RL-AB12', payload_kg: 14000, pallet_slots: 12, has_crane: true, crane_max_kg: 1200 });
    expect((await m.yard.post(`/api/branches/${m.branchId}/lorries`, { registration: 'RL-AB12', payload_kg: 8000, pallet_slots: 8 })).body.error.code).toBe('registration_taken');
    const noLimit = await m.yard.post(`/api/branches/${m.branchId}/lorries`, { registration: 'RL-AB13', payload_kg: 8000, pallet_slots: 8, has_crane: true });
    expect(noLimit.status).toBe(422);
    expect(noLimit.body.error.details[0].path).toBe('crane_max_kg');
    expect((await (await login(m.salesEmail)).post(`/api/branches/${m.branchId}/lorries`, { registration: 'RL-AB14', payload_kg: 8000, pallet_slots: 8 })).status).toBe(403);
    const list = (await m.yard.get(`/api/branches/${m.branchId}/lorries`)).body.lorries;
    expect(list.map((l: { registration: string }) => l.registration)).toEqual(['RL-AB12']);
  });

  it('makes a calendar of slots for every lorry on working days and shows each day with what is left', async () => {
    const m = await merchant();
    await m.yard.post(`/api/branches/${m.branchId}/lorries`, { registration: 'RL-CAL1', payload_kg: 14000, pallet_slots: 12 });
    await m.yard.post(`/api/branches/${m.branchId}/lorries`, { registration: 'RL-CAL2', payload_kg: 8000, pallet_slots: 8 });
    // 2031-03-03 is a Monday; the week to Sunday 2031-03-09 has five working days.
    const gen = await m.yard.post(`/api/branches/${m.branchId}/slots/generate`, { from: '2031-03-03', to: '2031-03-09', windows: ['07:30-12:00', '12:30-16:30'] });
    expect(gen.status).toBe(201);
    expect(gen.body).toEqual({ created: 5 * 2 * 2, skipped: 0 });
    expect((await m.yard.post(`/api/branches/${m.branchId}/slots/generate`, { from: '2031-03-03', to: '2031-03-09', windows: ['07:30-12:00'] })).body).toEqual({ created: 0, skipped: 10 });
    const day = slotDaySchema.parse((await m.yard.get(`/api/branches/${m.branchId}/slots?date=2031-03-05`)).body);
    expect(day.slots).toHaveLength(4);
    expect(day.slots[0]).toMatchObject({ time_window: '07:30-12:00', remaining_kg: 14000, remaining_pallets: 12, booked_kg: 0, bookings: [] });
    expect((await m.yard.get(`/api/branches/${m.branchId}/slots?date=2031-03-08`)).body.slots).toEqual([]);
    expect((await m.yard.get(`/api/branches/${m.branchId}/slots?date=2031-02-30`)).status).toBe(422);
    expect((await m.yard.post(`/api/branches/${m.branchId}/slots/generate`, { from: '2031-03-01', to: '2031-06-01', windows: ['07:30-12:00'] })).status).toBe(422);
  });
});

describe('booking orders into slots from the engine’s delivery plan', () => {
  it('books a confirmed order with the weight and pallets of its plan, and the contractor sees the slot', async () => {
    const m = await merchant();
    const { slot } = await lorryWithSlot(m, { registration: 'RL-BK01', payload_kg: 14000, pallet_slots: 12 });
    const k = await contractor(m);
    const order = await tileOrder(m, k, 2);
    const desk = await login(m.salesEmail);
    const res = await desk.post(`/api/orders/${order.id}/confirm`, { slot_id: slot.id });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const day = (await desk.get(`/api/branches/${m.branchId}/slots?date=${DAY}`)).body.slots[0];
    expect(day.booked_pallets).toBe(2);
    expect(day.booked_kg).toBeCloseTo(2 * FULL_PALLET_KG, 1);
    expect(day.remaining_kg).toBeCloseTo(14000 - 2 * FULL_PALLET_KG, 1);
    expect(day.remaining_pallets).toBe(10);
    expect(day.bookings[0]).toMatchObject({ order_id: order.id, pallets: 2, heaviest_pallet_kg: FULL_PALLET_KG });
    const seen = orderDetailSchema.parse((await k.c.get(`/api/orders/${order.id}`)).body);
    expect(seen.slot).toMatchObject({ slot_id: slot.id, date: DAY, time_window: '07:30-12:00', lorry: { registration: 'RL-BK01' }, pallets: 2 });
  });

  it('refuses to overbook the payload with 409 and leaves the order unconfirmed and the stock untouched', async () => {
    const m = await merchant();
    const { slot } = await lorryWithSlot(m, { registration: 'RL-KG01', payload_kg: 2000, pallet_slots: 12 });
    const k = await contractor(m);
    const first = await tileOrder(m, k, 2);
    const second = await tileOrder(m, k, 1);
    const desk = await login(m.salesEmail);
    expect((await desk.post(`/api/orders/${first.id}/confirm`, { slot_id: slot.id })).status).toBe(200);
    const reserved = (
      await t
        .db('branch_products')
        .where({ branch_id: m.branchId, product_id: m.product('TRS-FL420-SG') })
        .first()
    ).reserved;
    const res = await desk.post(`/api/orders/${second.id}/confirm`, { slot_id: slot.id });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('slot_full');
    expect(res.body.error.details[0]).toMatchObject({ remaining_kg: Math.round((2000 - 2 * FULL_PALLET_KG) * 10) / 10, remaining_pallets: 10, pallets: 1 });
    expect((await t.db('orders').where({ id: second.id }).first()).status).toBe('sent');
    expect(
      (
        await t
          .db('branch_products')
          .where({ branch_id: m.branchId, product_id: m.product('TRS-FL420-SG') })
          .first()
      ).reserved,
    ).toBe(reserved);
    expect((await t.db('delivery_slots').where({ id: slot.id }).first()).booked_pallets).toBe(2);
  });

  it('refuses to overbook the pallet slots, and books the order once it fits elsewhere', async () => {
    const m = await merchant();
    const { slot } = await lorryWithSlot(m, { registration: 'RL-PS01', payload_kg: 26000, pallet_slots: 3 });
    const { slot: other } = await lorryWithSlot(m, { registration: 'RL-PS02', payload_kg: 26000, pallet_slots: 6 });
    const k = await contractor(m);
    const a = await tileOrder(m, k, 2);
    const b = await tileOrder(m, k, 2);
    const desk = await login(m.salesEmail);
    expect((await desk.post(`/api/orders/${a.id}/confirm`, { slot_id: slot.id })).status).toBe(200);
    expect((await desk.post(`/api/orders/${b.id}/confirm`, {})).status).toBe(200);
    const full = await desk.send('put', `/api/orders/${b.id}/slot`, { slot_id: slot.id });
    expect(full.status).toBe(409);
    expect(full.body.error).toMatchObject({ code: 'slot_full', details: [expect.objectContaining({ remaining_pallets: 1, pallets: 2 })] });
    const moved = await desk.send('put', `/api/orders/${b.id}/slot`, { slot_id: other.id });
    expect(moved.status).toBe(200);
    expect(moved.body.slot.lorry.registration).toBe('RL-PS02');
    // Moving it back and forth keeps the running totals exact.
    expect((await desk.send('put', `/api/orders/${a.id}/slot`, { slot_id: other.id })).status).toBe(200);
    const rows = await t.db('delivery_slots').whereIn('id', [slot.id, other.id]).orderBy('id');
    expect(rows.map((r) => r.booked_pallets)).toEqual([0, 4]);
    expect((await desk.delete(`/api/orders/${a.id}/slot`)).status).toBe(200);
    expect((await t.db('delivery_slots').where({ id: other.id }).first()).booked_pallets).toBe(2);
  });

  it('a roof delivery needs a crane that lifts the heaviest pallet', async () => {
    const m = await merchant();
    const { slot: flat } = await lorryWithSlot(m, { registration: 'RL-NC01', payload_kg: 14000, pallet_slots: 12 });
    const { slot: small } = await lorryWithSlot(m, { registration: 'RL-SC01', payload_kg: 14000, pallet_slots: 12, has_crane: true, crane_max_kg: 800 });
    const { slot: big } = await lorryWithSlot(m, { registration: 'RL-BC01', payload_kg: 14000, pallet_slots: 12, has_crane: true, crane_max_kg: 1000 });
    const k = await contractor(m);
    const order = await tileOrder(m, k, 1, 'roof');
    const desk = await login(m.salesEmail);
    expect((await desk.post(`/api/orders/${order.id}/confirm`, { slot_id: flat.id })).body.error.code).toBe('crane_needed');
    const tooSmall = await desk.post(`/api/orders/${order.id}/confirm`, { slot_id: small.id });
    expect(tooSmall.body.error).toMatchObject({ code: 'crane_too_small', details: [expect.objectContaining({ heaviest_pallet_kg: FULL_PALLET_KG, crane_max_kg: 800 })] });
    expect((await desk.post(`/api/orders/${order.id}/confirm`, { slot_id: big.id })).status).toBe(200);
  });
});

describe('the driver’s day', () => {
  it('assigns a driver, sends the order out, gives the driver a loading sheet and records the delivery', async () => {
    const m = await merchant();
    const { slot } = await lorryWithSlot(m, { registration: 'RL-DR01', payload_kg: 14000, pallet_slots: 12, has_crane: true, crane_max_kg: 1200 }, inDays(0), '00:00-23:59');
    const k = await contractor(m);
    const order = (await k.c.post('/api/orders', { estimate_id: k.estimate.id, branch_id: m.branchId, requested_date: inDays(0), delivery_method: 'roof', notes: 'Ring on arrival' })).body;
    const desk = await login(m.salesEmail);
    expect((await desk.post(`/api/orders/${order.id}/confirm`, { slot_id: slot.id })).status).toBe(200);
    const tiles = order.lines.find((l: { sku: string }) => l.sku === 'TRS-FL420-SG');
    const stockBefore = await t
      .db('branch_products')
      .where({ branch_id: m.branchId, product_id: m.product('TRS-FL420-SG') })
      .first();

    expect((await m.yard.post(`/api/orders/${order.id}/dispatch`)).body.error.code).toBe('no_driver');
    expect((await (await login(m.salesEmail)).send('patch', `/api/slots/${slot.id}`, { driver_id: m.driverId })).status).toBe(403);
    const assigned = await m.yard.send('patch', `/api/slots/${slot.id}`, { driver_id: m.driverId });
    expect(assigned.body.driver).toMatchObject({ id: m.driverId });
    await loadRunOf(m.yard, order.id);
    const out = await m.yard.post(`/api/orders/${order.id}/dispatch`);
    expect(out.status).toBe(200);
    expect(out.body.status).toBe('on_the_road');
    const mail = t.mail.messages.find((x) => x.to.includes(k.email) && /out for delivery/.test(x.subject)) ?? (await t.mail.waitFor(k.email));
    expect(mail).toBeDefined();

    const driver = await login(m.driverEmail);
    const sheet = loadingSheetSchema.parse((await driver.get('/api/deliveries')).body);
    expect(sheet.runs).toHaveLength(1);
    const stop = sheet.runs[0].stops[0];
    expect(stop.order_id).toBe(order.id);
    const engine = k.estimate.result;
    expect(stop.pallets).toHaveLength(engine.pallets.length);
    // Loaded in reverse: the pallet that comes off first (n = 1) goes on last.
    expect(stop.pallets.map((p) => p.n)).toEqual(engine.pallets.map((p: { n: number }) => p.n).reverse());
    expect(stop.pallets.flatMap((p) => p.faces.map((f) => f.face))).toEqual(expect.arrayContaining(['Front', 'Back']));
    expect(stop.notes.join(' ')).toMatch(/Set down: Verge by plot 1/);
    expect(stop.notes.join(' ')).toMatch(/Gate opens 07:30/);
    expect(stop.cautions[0]).toMatch(/lift plan/);
    expect((await (await login(m.otherDriverEmail)).get('/api/deliveries')).body.runs).toEqual([]);
    expect((await driver.get(`/api/deliveries?driver_id=${m.driverId + 1}`)).status).toBe(403);

    expect((await (await login(m.otherDriverEmail)).post(`/api/orders/${order.id}/delivery`, { received_by: 'Lowri' })).status).toBe(403);
    const rec = await driver.post(`/api/orders/${order.id}/delivery`, { received_by: 'Lowri Haskett', notes: 'Two tiles broken in one pack', lines: [{ line_id: tiles.id, delivered_quantity: tiles.quantity - 2 }] });
    expect(rec.status, JSON.stringify(rec.body)).toBe(200);
    expect(rec.body.status).toBe('delivered');
    expect(rec.body.delivery).toMatchObject({ received_by: 'Lowri Haskett', notes: 'Two tiles broken in one pack' });
    expect(rec.body.lines.find((l: { id: number }) => l.id === tiles.id)).toMatchObject({ delivered_quantity: tiles.quantity - 2, reserved_quantity: 0 });
    const stockAfter = await t
      .db('branch_products')
      .where({ branch_id: m.branchId, product_id: m.product('TRS-FL420-SG') })
      .first();
    expect(stockBefore.reserved - stockAfter.reserved).toBe(tiles.quantity);
    expect(stockBefore.on_hand - stockAfter.on_hand).toBe(tiles.quantity - 2);
    expect(rec.body.timeline.at(-1).summary).toMatch(/short: TRS-FL420-SG/);
    expect((await driver.post(`/api/orders/${order.id}/delivery`, { received_by: 'again' })).status).toBe(409);
  });
});

describe('no role reaches another merchant’s fleet or calendar', () => {
  for (const role of ROLES) {
    it(`${role}: lorries, slots and bookings of another merchant are refused and unchanged`, async () => {
      const m = await merchant();
      const { lorry, slot } = await lorryWithSlot(m, { registration: 'RL-XT01', payload_kg: 14000, pallet_slots: 12 });
      const before = { lorries: await t.db('lorries').where({ id: lorry.id }), slots: await t.db('delivery_slots').where({ id: slot.id }) };
      const actor = await makeOrgWithUser(t.db, kindOfRole(role), role);
      const c = await login(actor.email);
      const attempts = [
        await c.get(`/api/branches/${m.branchId}/lorries`),
        await c.post(`/api/branches/${m.branchId}/lorries`, { registration: 'RL-XT02', payload_kg: 8000, pallet_slots: 8 }),
        await c.patch(`/api/lorries/${lorry.id}`, { payload_kg: 100 }),
        await c.delete(`/api/lorries/${lorry.id}`),
        await c.get(`/api/branches/${m.branchId}/slots?date=${DAY}`),
        await c.post(`/api/branches/${m.branchId}/slots`, { lorry_id: lorry.id, date: DAY, time_window: '13:00-15:00' }),
        await c.post(`/api/branches/${m.branchId}/slots/generate`, { from: DAY, to: DAY, windows: ['13:00-15:00'] }),
        await c.get(`/api/slots/${slot.id}`),
        await c.patch(`/api/slots/${slot.id}`, { time_window: '13:00-15:00' }),
        await c.delete(`/api/slots/${slot.id}`),
      ];
      for (const res of attempts) expect([403, 404], `${role}: ${res.status} ${JSON.stringify(res.body.error)}`).toContain(res.status);
      expect({ lorries: await t.db('lorries').where({ id: lorry.id }), slots: await t.db('delivery_slots').where({ id: slot.id }) }).toEqual(before);
      if (kindOfRole(role) === 'merchant' && role !== 'driver' && role !== 'merchant_sales') {
        // Their own order cannot be booked onto another merchant's lorry either.
        const own = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
        expect((await (await login(own.email)).send('put', '/api/orders/999999/slot', { slot_id: slot.id })).status).toBe(404);
      }
    });
  }
});
