import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { orderDetailSchema } from '../../shared/schemas/order.schema';
import { driverDaySchema } from '../../shared/schemas/run.schema';
import { makeUser } from '../setup/factories';
import { contractorWithEstimate, loadRunOf, merchantWithCatalogue, orderBody, type TestMerchant } from '../setup/order-scenario';
import { signIn } from '../setup/scenario';
import { createTestApp, type Client, type TestApp } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

let lorryNo = 0;

/** A crane lorry with a run today (the firm's calendar), driven by the merchant's driver. */
async function runToday(m: TestMerchant) {
  const yard = await signIn(t.app, m.dispatcherEmail);
  const l = await yard.post(`/api/branches/${m.branchId}/lorries`, {
    registration: `RL-LF${String(++lorryNo).padStart(2, '0')}`,
    name: 'Crane rigid',
    payload_kg: 26000,
    pallet_slots: 26,
    has_crane: true,
    crane_max_kg: 2000,
  });
  expect(l.status, JSON.stringify(l.body)).toBe(201);
  const s = await yard.post(`/api/branches/${m.branchId}/slots`, { lorry_id: l.body.id, date: t.config.calendar.today(), time_window: '00:00-23:59' });
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  expect((await yard.patch(`/api/slots/${s.body.id}`, { driver_id: m.driverId })).status).toBe(200);
  return { yard, slotId: s.body.id as number };
}

/** An order of a new contractor (the gable schedule: House Front and Back) confirmed onto the run and sent out. */
async function dropOnRun(m: TestMerchant, run: { yard: Client; slotId: number }, method: 'ground' | 'roof') {
  const k = await contractorWithEstimate(t, m);
  const placed = orderDetailSchema.parse((await k.c.post('/api/orders', orderBody(k, m, { requested_date: t.config.calendar.today(), delivery_method: method }))).body);
  const desk = await signIn(t.app, m.salesEmail);
  expect((await desk.post(`/api/orders/${placed.id}/confirm`, { slot_id: run.slotId })).status).toBe(200);
  await loadRunOf(run.yard, placed.id);
  expect((await run.yard.post(`/api/orders/${placed.id}/dispatch`)).status).toBe(200);
  return { k, orderId: placed.id };
}

describe("the driver's day carries what the phone needs to draw each crane drop's faces", () => {
  it("gives the driver, for each face a pallet serves, the face's shape and the engine's stacks, and the roof system, though the driver cannot read the estimate", async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const lift = await dropOnRun(m, run, 'roof');
    const second = await dropOnRun(m, run, 'roof');
    const ground = await dropOnRun(m, run, 'ground');
    const driver = await signIn(t.app, m.driverEmail);
    const res = await driver.get('/api/driver/runs');
    expect(res.status).toBe(200);
    const day = driverDaySchema.parse(res.body);
    expect(day.runs).toHaveLength(1);
    const [r] = day.runs;
    const drop = r.drops.find((d) => d.order_id === lift.orderId)!;
    const estimate = lift.k.estimate as { id: number; system_input: unknown; result: { faces: { building: string; face: string; stacks: number; stacks_by_row: number[]; tiles: number }[] } };

    const faces = drop.landing_plan.filter((f) => f.face !== 'spare');
    expect(faces.map((f) => f.face).sort()).toEqual(['Back', 'Front']);
    for (const f of faces) {
      expect(f.drawing, `${f.face} has its drawing`).not.toBeNull();
      // The shape is the schedule row as imported (House,Front|Back,1,40,5000,8000,verge,verge,ridge): a
      // rectangle between verges, so the top is as long as the eaves.
      expect(f.drawing!.shape).toEqual({ eaves_mm: 8000, top_mm: 8000, rafter_mm: 5000, pitch_deg: 40, left: 'verge', right: 'verge', top: 'ridge' });
      expect(f.drawing!.openings).toEqual([]);
      // The engine's own figures for that face, as the estimate stored them.
      expect(f.drawing!.result).toEqual(estimate.result.faces[f.estimate_face_index!]);
      expect(f.drawing!.result.face).toBe(f.face);
      // Stacks of six on every second batten (common practice; the roof system's loading), every stack placed.
      const { result } = f.drawing!;
      expect(result.stacks).toBe(Math.ceil(result.tiles / 6));
      expect(result.stacks_by_row.reduce((s, n) => s + n, 0)).toBe(result.stacks);
      expect(result.stacks_by_row).toHaveLength(Math.floor(result.courses / 2));
    }
    // Both slopes alike, so they are loaded in step.
    expect(faces[0].drawing!.result.stacks_by_row).toEqual(faces[1].drawing!.result.stacks_by_row);
    expect(drop.roof_system).toEqual(estimate.system_input);
    expect(drop.roof_system!.roof_loading).toEqual({ stack_size: 6, every_nth_batten: 2 });
    // A ground drop lands nothing on the roof: no plan, no system.
    const onGround = r.drops.find((d) => d.order_id === ground.orderId)!;
    expect(onGround.landing_plan).toEqual([]);
    expect(onGround.roof_system).toBeNull();
    expect(r.drops.find((d) => d.order_id === second.orderId)!.landing_plan.every((f) => f.face === 'spare' || f.drawing !== null)).toBe(true);

    // The working-at-height and roof-loading cautions come once for the run, though two drops are crane lifts.
    expect(r.cautions.filter((c) => /work at height/i.test(c))).toHaveLength(1);
    expect(r.cautions.filter((c) => /^Load the roof evenly/.test(c))).toHaveLength(1);
    expect(r.cautions.filter((c) => /lorry crane needs a lift plan/.test(c)).length).toBeGreaterThanOrEqual(1);
    expect(new Set(r.cautions).size).toBe(r.cautions.length);

    // The estimate itself stays the contractor's: the driver is refused it.
    expect([403, 404]).toContain((await driver.get(`/api/estimates/${estimate.id}`)).status);
  });

  it("refuses another driver the run and its face drawings, and another merchant's dispatcher the driver", async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    await dropOnRun(m, run, 'roof');
    const other = await signIn(t.app, (await makeUser(t.db, m.organisationId, 'driver')).email);
    // Their own day has no runs, so no faces of this one.
    const own = await other.get('/api/driver/runs');
    expect(own.status).toBe(200);
    expect(driverDaySchema.parse(own.body).runs).toEqual([]);
    // Asking for the assigned driver's day by name is refused.
    const asked = await other.get(`/api/driver/runs?driver_id=${m.driverId}`);
    expect(asked.status).toBe(403);
    expect(JSON.stringify(asked.body)).not.toMatch(/stacks_by_row|roof_system/);
    // Another merchant's dispatcher finds no such driver.
    const elsewhere = await merchantWithCatalogue(t);
    const foreign = await (await signIn(t.app, elsewhere.dispatcherEmail)).get(`/api/driver/runs?driver_id=${m.driverId}`);
    expect(foreign.status).toBe(404);
    expect(JSON.stringify(foreign.body)).not.toMatch(/stacks_by_row|roof_system/);
  });
});
