import { PDFParse } from 'pdf-parse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { palletViewSchema, runDaySchema, runSchema, runWeekSchema, type Run } from '../../shared/schemas/run.schema';
import { makeOrgWithUser, makeUser } from '../setup/factories';
import { contractorWithEstimate, merchantWithCatalogue, orderBody, type TestMerchant } from '../setup/order-scenario';
import { signIn } from '../setup/scenario';
import { createTestApp, type TestApp } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const login = (email: string) => signIn(t.app, email);

async function pdfText(data: Buffer) {
  const parser = new PDFParse({ data: new Uint8Array(data) });
  try {
    const r = await parser.getText();
    return { text: r.text, pages: r.total };
  } finally {
    await parser.destroy();
  }
}

/** A merchant with a crane lorry and a run on `date`, with two drops booked onto it (the second by crane). */
async function runWithTwoDrops(date = t.config.calendar.today(), m?: TestMerchant, lorrySize: Record<string, number> = { payload_kg: 18_000, pallet_slots: 14 }) {
  m ??= await merchantWithCatalogue(t);
  const yard = await login(m.dispatcherEmail);
  const desk = await login(m.salesEmail);
  const lorry = await yard.post(`/api/branches/${m.branchId}/lorries`, { registration: `RL${Math.floor(Math.random() * 9000 + 1000)} RUN`, name: 'Crane rigid', has_crane: true, crane_max_kg: 1200, ...lorrySize });
  expect(lorry.status, JSON.stringify(lorry.body)).toBe(201);
  const slot = await yard.post(`/api/branches/${m.branchId}/slots`, { lorry_id: lorry.body.id, date, time_window: '07:30-12:00', driver_id: m.driverId });
  expect(slot.status, JSON.stringify(slot.body)).toBe(201);
  const orders: number[] = [];
  for (const method of ['ground', 'roof'] as const) {
    const k = await contractorWithEstimate(t, m);
    const placed = await k.c.post('/api/orders', orderBody(k, m, { requested_date: date, delivery_method: method }));
    expect(placed.status, JSON.stringify(placed.body)).toBe(201);
    const confirmed = await desk.post(`/api/orders/${placed.body.id}/confirm`, { slot_id: slot.body.id });
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(200);
    orders.push(placed.body.id);
  }
  return { m, yard, desk, runId: slot.body.id as number, orders, lorry: lorry.body };
}

async function tickAll(c: Awaited<ReturnType<typeof login>>, run: Run, except: number[] = []) {
  for (const i of run.deck.positions.keys()) {
    if (except.includes(i)) continue;
    expect((await c.post(`/api/runs/${run.id}/positions/${i}/loaded`)).status).toBe(200);
  }
}

describe('runs', () => {
  it("gives the branch's day of runs with drops in booking order, a deck plan and a pick list per drop", async () => {
    const { m, yard, runId, orders } = await runWithTwoDrops();
    const res = await yard.get(`/api/branches/${m.branchId}/runs?date=${t.config.calendar.today()}`);
    expect(res.status).toBe(200);
    const day = runDaySchema.parse(res.body);
    expect(day).toHaveLength(1);
    const run = day[0];
    expect(run.id).toBe(runId);
    expect(run.drops.map((d) => d.order_id)).toEqual(orders);
    expect(run.drops.map((d) => d.position)).toEqual([1, 2]);
    expect(run.status).toBe('planned');
    expect(run.lorry).toMatchObject({ deck_length_mm: 7300, deck_width_mm: 2450 });
    // Every pallet of both drops on the deck once; its weight is the sum of the drops'.
    expect(run.pallets).toBe(run.drops.reduce((s, d) => s + d.pallets, 0));
    expect(run.deck.positions).toHaveLength(run.pallets);
    expect(run.deck.left_kg + run.deck.right_kg).toBeCloseTo(run.weight_kg, 0);
    // The crane drop (2nd off) sits at the front, the ground drop (1st off) behind it.
    const rows = (drop: number) => run.deck.positions.filter((p) => p.drop === drop).map((p) => p.row);
    expect(Math.min(...rows(1))).toBeGreaterThanOrEqual(Math.max(...rows(2)));
    expect(run.pick_list.map((p) => p.order_id)).toEqual(orders);
    expect(run.pick_list[0].lines.length).toBeGreaterThan(0);
    expect(run.pick_list[0].lines.every((l) => l.quantity > 0)).toBe(true);

    const one = runSchema.parse((await yard.get(`/api/runs/${runId}`)).body);
    expect(one.deck).toEqual(run.deck);

    const week = runWeekSchema.parse((await yard.get(`/api/branches/${m.branchId}/run-week?from=${t.config.calendar.today()}`)).body);
    expect(week.days).toHaveLength(7);
    expect(week.days[0].runs).toEqual([expect.objectContaining({ id: runId, drops: 2, pallets: run.pallets, loaded_count: 0, status: 'planned' })]);
  });

  it('sets the drop order; a new booking goes last; a bad list names the field', async () => {
    // A trailer of 13.6 m takes 26 pallets: room for a third drop.
    const { m, yard, desk, runId, orders } = await runWithTwoDrops(t.config.calendar.fromToday(1), undefined, { payload_kg: 26_000, pallet_slots: 26, deck_length_mm: 13_600 });
    const swapped = await yard.send('put', `/api/runs/${runId}/drops`, { order_ids: [orders[1], orders[0]] });
    expect(swapped.status, JSON.stringify(swapped.body)).toBe(200);
    expect(swapped.body.drops.map((d: { order_id: number }) => d.order_id)).toEqual([orders[1], orders[0]]);
    // The crane drop now comes off first: its pallets come off first, so they are loaded last.
    const run = runSchema.parse(swapped.body);
    const last = run.deck.positions[run.deck.loading_sequence.at(-1)!];
    expect(last).toMatchObject({ order_id: orders[1], pallet: 1, drop: 1 });

    const k = await contractorWithEstimate(t, m);
    const third = (await k.c.post('/api/orders', orderBody(k, m, { requested_date: t.config.calendar.fromToday(1) }))).body;
    expect((await desk.post(`/api/orders/${third.id}/confirm`, { slot_id: runId })).status).toBe(200);
    const after = runSchema.parse((await yard.get(`/api/runs/${runId}`)).body);
    expect(after.drops.map((d) => d.order_id)).toEqual([orders[1], orders[0], third.id]);

    const missing = await yard.send('put', `/api/runs/${runId}/drops`, { order_ids: [orders[0], orders[1]] });
    expect(missing.status).toBe(422);
    expect(missing.body.error.details).toEqual([expect.objectContaining({ path: 'order_ids', message: expect.stringContaining(`RL-${String(third.id).padStart(6, '0')}`) })]);
    const stranger = await yard.send('put', `/api/runs/${runId}/drops`, { order_ids: [orders[0], orders[1], third.id, 999_999] });
    expect(stranger.status).toBe(422);
    expect(stranger.body.error.details[0]).toMatchObject({ path: 'order_ids.3' });
    const twice = await yard.send('put', `/api/runs/${runId}/drops`, { order_ids: [orders[0], orders[0], orders[1], third.id] });
    expect(twice.body.error.details[0]).toMatchObject({ path: 'order_ids.1', message: expect.stringContaining('twice') });
    const empty = await yard.send('put', `/api/runs/${runId}/drops`, { order_ids: [] });
    expect(empty.status).toBe(422);
    expect(empty.body.error.details[0].path).toBe('order_ids');
  });

  it('ticks and unticks pallets; an index off the deck is refused naming it', async () => {
    const { m, yard, runId } = await runWithTwoDrops(t.config.calendar.fromToday(1));
    // The day plan (kept in memory between changes) shows every tick at once.
    const dayPath = `/api/branches/${m.branchId}/runs?date=${t.config.calendar.fromToday(1)}`;
    expect(runDaySchema.parse((await yard.get(dayPath)).body)[0].loaded_count).toBe(0);
    expect((await yard.post(`/api/runs/${runId}/positions/1/loaded`)).status).toBe(200);
    expect(runDaySchema.parse((await yard.get(dayPath)).body)[0].loaded_count).toBe(1);
    expect((await yard.delete(`/api/runs/${runId}/positions/1/loaded`)).status).toBe(200);
    expect(runDaySchema.parse((await yard.get(dayPath)).body)[0].loaded_count).toBe(0);
    const ticked = runSchema.parse((await yard.post(`/api/runs/${runId}/positions/0/loaded`)).body);
    expect(ticked.deck.positions[0].loaded).toBe(true);
    expect(ticked.loaded_count).toBe(1);
    expect(ticked.status).toBe('loading');
    const again = runSchema.parse((await yard.post(`/api/runs/${runId}/positions/0/loaded`)).body);
    expect(again.loaded_count).toBe(1);
    const unticked = runSchema.parse((await yard.delete(`/api/runs/${runId}/positions/0/loaded`)).body);
    expect(unticked.loaded_count).toBe(0);
    const off = await yard.post(`/api/runs/${runId}/positions/${ticked.pallets}/loaded`);
    expect(off.status).toBe(422);
    expect(off.body.error.details[0]).toMatchObject({ path: 'index' });
  });

  it('refuses to send out with a pallet not loaded, then sends out on its day once all are loaded', async () => {
    const { m, yard, runId, orders } = await runWithTwoDrops();
    const run = runSchema.parse((await yard.get(`/api/runs/${runId}`)).body);
    await tickAll(yard, run, [0]);
    const refused = await yard.post(`/api/runs/${runId}/send-out`, {});
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('not_loaded');
    expect(refused.body.error.message).toMatch(/1 pallet is not ticked loaded/);
    // The per-order dispatch keeps the same rule for the order whose pallet is missing.
    const missingOrder = run.deck.positions[0].order_id;
    const perOrder = await yard.post(`/api/orders/${missingOrder}/dispatch`);
    expect(perOrder.status).toBe(409);
    expect(perOrder.body.error.code).toBe('not_loaded');

    await yard.post(`/api/runs/${runId}/positions/0/loaded`);
    const loaded = runSchema.parse((await yard.get(`/api/runs/${runId}`)).body);
    expect(loaded.status).toBe('loaded');
    const out = await yard.post(`/api/runs/${runId}/send-out`, {});
    expect(out.status, JSON.stringify(out.body)).toBe(200);
    const sent = runSchema.parse(out.body);
    expect(sent.status).toBe('on_the_road');
    expect(sent.dispatched_at).not.toBeNull();
    for (const id of orders) expect((await yard.get(`/api/orders/${id}`)).body.status).toBe('on_the_road');
    expect((await yard.post(`/api/runs/${runId}/send-out`, {})).body.error.code).toBe('run_sent_out');
    expect((await yard.post(`/api/runs/${runId}/positions/0/loaded`)).status).toBe(409);
    void m;
  });

  it('refuses to send out before the day; per-order dispatch too; a dispatcher overrides with a reason that goes on each timeline', async () => {
    const { m, yard, desk, runId, orders } = await runWithTwoDrops(t.config.calendar.fromToday(2));
    const run = runSchema.parse((await yard.get(`/api/runs/${runId}`)).body);
    await tickAll(yard, run);
    const early = await yard.post(`/api/runs/${runId}/send-out`, {});
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe('not_today');
    expect((await yard.post(`/api/orders/${orders[0]}/dispatch`)).body.error.code).toBe('not_today');
    expect((await yard.get(`/api/orders/${orders[0]}`)).body.status).toBe('confirmed');

    // The desk may send out on the day, but not against the rules.
    const bySales = await desk.post(`/api/runs/${runId}/send-out`, { override_reason: 'Customer asked for it early' });
    expect(bySales.status).toBe(403);
    const tooShort = await yard.post(`/api/runs/${runId}/send-out`, { override_reason: 'x' });
    expect(tooShort.status).toBe(422);
    expect(tooShort.body.error.details[0].path).toBe('override_reason');

    const owner = await login(m.ownerEmail);
    const forced = await owner.post(`/api/runs/${runId}/send-out`, { override_reason: 'Site asked for the tiles two days early' });
    expect(forced.status, JSON.stringify(forced.body)).toBe(200);
    for (const id of orders) {
      const o = (await yard.get(`/api/orders/${id}`)).body;
      expect(o.status).toBe('on_the_road');
      const events = o.events ?? o.timeline;
      expect(JSON.stringify(events)).toContain('Site asked for the tiles two days early');
      expect(JSON.stringify(events)).toContain('not its day');
    }
  });

  it('lets the yard read an order it loads, read-only', async () => {
    const { yard, orders } = await runWithTwoDrops(t.config.calendar.fromToday(1));
    const o = await yard.get(`/api/orders/${orders[0]}`);
    expect(o.status).toBe(200);
    expect(o.body.id).toBe(orders[0]);
    expect((await yard.post(`/api/orders/${orders[0]}/confirm`, {})).status).toBe(403);
  });

  it("shows a driver only the runs assigned to them; another driver is refused; another firm's run is 404", async () => {
    const { m, runId } = await runWithTwoDrops(t.config.calendar.fromToday(1));
    const driver = await login(m.driverEmail);
    expect((await driver.get(`/api/runs/${runId}`)).status).toBe(200);
    const other = await makeUser(t.db, m.organisationId, 'driver');
    const otherDriver = await login(other.email);
    expect((await otherDriver.get(`/api/runs/${runId}`)).status).toBe(403);
    expect((await otherDriver.get(`/api/runs/${runId}/loading-sheet.pdf`)).status).toBe(403);
    const day = await otherDriver.get(`/api/branches/${m.branchId}/runs?date=${t.config.calendar.fromToday(1)}`);
    expect(day.status).toBe(200);
    expect(day.body).toEqual([]);
    expect((await driver.post(`/api/runs/${runId}/positions/0/loaded`)).status).toBe(403);

    const firm = await makeOrgWithUser(t.db, 'merchant', 'merchant_dispatcher');
    const stranger = await login(firm.email);
    for (const path of [`/api/runs/${runId}`, `/api/runs/${runId}/loading-sheet.pdf`, `/api/runs/${runId}/labels.pdf`, `/api/branches/${m.branchId}/runs?date=${t.config.calendar.today()}`]) {
      expect((await stranger.get(path)).status, path).toBe(404);
    }
    expect((await stranger.post(`/api/runs/${runId}/send-out`, {})).status).toBe(404);
    expect((await stranger.post(`/api/runs/${runId}/positions/0/loaded`)).status).toBe(404);
    const contractor = await makeOrgWithUser(t.db, 'contractor', 'contractor_owner');
    expect((await (await login(contractor.email)).get(`/api/runs/${runId}`)).status).toBe(403);
  });

  it("opens a pallet's page as its label's QR code does, with the index to tick it", async () => {
    const { yard, runId, orders } = await runWithTwoDrops(t.config.calendar.fromToday(1));
    const res = await yard.get(`/api/orders/${orders[1]}/pallets/1`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const view = palletViewSchema.parse(res.body);
    expect(view).toMatchObject({ order_id: orders[1], pallet: 1, drop: 2, drops: 2, run_id: runId, loaded: false });
    expect((await yard.post(`/api/runs/${runId}/positions/${view.position_index}/loaded`)).status).toBe(200);
    expect((await yard.get(`/api/orders/${orders[1]}/pallets/1`)).body.loaded).toBe(true);
    expect((await yard.get(`/api/orders/${orders[1]}/pallets/99`)).status).toBe(404);
  });
});

describe('run documents', () => {
  it('prints a loading sheet with the lorry, driver, drops in order, the pallet list and its weights, cautions once', async () => {
    const { yard, runId } = await runWithTwoDrops(t.config.calendar.fromToday(1));
    const run = runSchema.parse((await yard.get(`/api/runs/${runId}`)).body);
    const res = await yard
      .get(`/api/runs/${runId}/loading-sheet.pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const { text } = await pdfText(res.body as Buffer);
    if (process.env.DUMP_PDF) console.log(text);
    expect(text).toContain(run.lorry.registration);
    expect(text).toContain(run.driver!.name);
    expect(text).toMatch(new RegExp(`Drop 1 of 2 — ${run.drops[0].reference}`));
    expect(text).toMatch(new RegExp(`Drop 2 of 2 — ${run.drops[1].reference}`));
    expect(text.indexOf(`Drop 1 of 2`)).toBeLessThan(text.indexOf('Drop 2 of 2'));
    // Every pallet's weight as in the deck plan; the load's weight and payload.
    for (const p of run.deck.positions) expect(text).toContain(`${p.weight_kg.toLocaleString('en-GB')} kg`);
    expect(text).toContain(`${run.weight_kg.toLocaleString('en-GB')} kg of 18,000 kg payload`);
    expect(text).toContain(`${run.deck.cog_from_front_mm.toLocaleString('en-GB')} mm from the front`);
    // The set-down and a caution, each once although both drops share them.
    expect(text.match(/clear exclusion zone below/g)).toHaveLength(1);
    expect(text.match(/Pallets set down at ground level/g)).toHaveLength(1);
  });

  it('prints A6 pallet labels four to an A4 sheet with drop n of m, pallet n of m, faces and weight', async () => {
    const { yard, runId } = await runWithTwoDrops(t.config.calendar.fromToday(1));
    const run = runSchema.parse((await yard.get(`/api/runs/${runId}`)).body);
    const res = await yard
      .get(`/api/runs/${runId}/labels.pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    const { text, pages } = await pdfText(res.body as Buffer);
    if (process.env.DUMP_PDF) console.log(text);
    expect(pages).toBe(Math.ceil(run.pallets / 4));
    const first = run.drops[0];
    for (let n = 1; n <= first.pallets; n++) expect(text).toContain(`Pallet ${n} of ${first.pallets}`);
    expect(text.match(/Drop 1 of 2/g)).toHaveLength(first.pallets);
    expect(text.match(/Drop 2 of 2/g)).toHaveLength(run.drops[1].pallets);
    const tilePallet = run.deck.positions.find((p) => p.faces.length > 0)!;
    expect(text).toContain(`${tilePallet.faces[0].building} ${tilePallet.faces[0].face} (${tilePallet.faces[0].tiles})`);
    expect(text).toContain(`Weight ${tilePallet.weight_kg.toLocaleString('en-GB')} kg`);
    expect(text).toContain(`${t.config.appUrl}/yard/pallets/${first.order_id}/1`);
    // Accessories by their product names and units, never the engine's words.
    expect(text).not.toMatch(/\bclip: |batten_nails|Clip \d+ units/);
  });
});
