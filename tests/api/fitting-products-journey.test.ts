import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runEstimateFromCsv, formatProblem } from '../../shared/engine/estimate';
import type { Totals } from '../../shared/engine/result';
import type { SystemRole } from '../../shared/schemas/catalogue.schema';
import { estimateSchema, type Estimate } from '../../shared/schemas/estimate.schema';
import { orderDetailSchema, quoteRequestSchema } from '../../shared/schemas/order.schema';
import { loadingSheetSchema } from '../../shared/schemas/slot.schema';
import { DEMO_CATALOGUES, installCatalogue, type DemoMerchant } from '../../seeds/02-catalogue';
import { makeOrgWithUser, makeUser } from '../setup/factories';
import { inDays, signIn } from '../setup/scenario';
import { createTestApp, type TestApp } from '../setup/test-app';

/**
 * A roof that needs every fitting: a hipped main roof (hip irons), a gable wing meeting it in two
 * valleys with verges at its gable end, a lean-to porch against a wall (top abutment), and a chimney
 * in the front slope (side flashings, an apron and a back gutter). Its special pieces and fittings go
 * from the estimate through a quote, an order, the lorry's loading sheet and the exports, each at the
 * engine's quantity and the branch's price of the system's product.
 */
const SCHEDULE = [
  'building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top,ridge',
  'Hawthorn,Main front,1,40,,3000,8000,2000,hip,hip,ridge,Main',
  'Hawthorn,Main back,1,40,,3000,8000,2000,hip,hip,ridge,Main',
  'Hawthorn,East hip end,1,40,,3000,6000,0,hip,hip,ridge,Main',
  'Hawthorn,West hip end,1,40,,3000,6000,0,hip,hip,ridge,Main',
  'Hawthorn,Wing left,1,42,3900,,4300,7200,verge,valley,ridge,Wing',
  'Hawthorn,Wing right,1,42,3900,,4300,7200,valley,verge,ridge,Wing',
  'Hawthorn,Porch,1,35,1800,,2400,,verge,verge,abutment,',
  '',
].join('\n');
const OPENINGS = ['building,face,kind,width_mm,height_mm,quantity', 'Hawthorn,Main front,chimney,600,900,1', ''].join('\n');

const [TOLLERBECK, CADDONMERE] = DEMO_CATALOGUES;

/** Each fitting role and the engine total it is priced on, read independently of the server's bill. */
const ENGINE_FIGURE: Partial<Record<SystemRole, (t: Totals) => number>> = {
  eaves_tile: (t) => t.eaves_tiles_order,
  top_tile: (t) => t.top_tiles_order,
  tile_and_half: (t) => t.tile_and_half_order,
  dry_verge: (t) => t.dry_verge_units,
  ridge_end_cap: (t) => t.ridge_end_caps,
  hip_iron: (t) => t.hip_irons,
  valley_trough: (t) => t.valley_units,
  eaves_vent: (t) => t.eaves_m,
  verge_undercloak: (t) => t.verge_m,
  // One flashing product covers the four runs, summed to the centimetre.
  flashing: (t) => Math.round((t.flashings.side_abutment_m + t.flashings.top_abutment_m + t.flashings.apron_m + t.flashings.back_gutter_m) * 100) / 100,
};

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const login = (email: string) => signIn(t.app, email);

async function merchantWith(catalogue: DemoMerchant, systemName: string) {
  const owner = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
  const installed = await installCatalogue(t.db, owner.organisationId, [{ id: owner.branchId!, priceFactor: 1, stockFactor: 1 }], catalogue);
  const sales = await makeUser(t.db, owner.organisationId, 'merchant_sales');
  const dispatcher = await makeUser(t.db, owner.organisationId, 'merchant_dispatcher');
  const driver = await makeUser(t.db, owner.organisationId, 'driver');
  const system = catalogue.systems.find((s) => s.name === systemName)!;
  return {
    branchId: owner.branchId!,
    salesEmail: sales.email,
    dispatcherEmail: dispatcher.email,
    driverId: driver.userId,
    systemId: installed.systemIds.find((s) => s.name === systemName)!.id,
    /** The system's product for a role, as the catalogue sells it at this branch (price factor 1). */
    productOf: (role: SystemRole) => {
      const sku = system.components[role]!;
      const p = catalogue.products.find((x) => x.sku === sku)!;
      return { id: installed.productIds.get(sku)!, sku, name: p.name, unit: p.unit, pack_size: p.pack_size, price: catalogue.prices[sku] };
    },
  };
}

async function estimateFor(systemId: number) {
  const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator');
  const c = await login(u.email);
  const p = await c.post('/api/projects', { name: 'Hawthorn Close', site_address: '3 Hawthorn Close, Tollerbeck', crane_lift: 'allowed', overhead_lines: 'none', set_down_place: 'Front drive' });
  expect(p.status, JSON.stringify(p.body)).toBe(201);
  const token = await c.csrf();
  const s = await c.agent.post(`/api/projects/${p.body.id}/schedule`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(SCHEDULE);
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  const o = await c.agent.post(`/api/projects/${p.body.id}/schedule/openings`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(OPENINGS);
  expect(o.status, JSON.stringify(o.body)).toBe(201);
  const e = await c.post(`/api/projects/${p.body.id}/estimates`, { system_id: systemId });
  expect(e.status, JSON.stringify(e.body)).toBe(201);
  return { c, estimate: estimateSchema.parse(e.body) };
}

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (chunk: Buffer) => chunks.push(chunk));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

async function journey(catalogue: DemoMerchant, systemName: string, fittings: SystemRole[]) {
  const m = await merchantWith(catalogue, systemName);
  const { c, estimate: e } = await estimateFor(m.systemId);

  // The engine's own take-off of the same schedule, openings and system, worked out here.
  const direct = runEstimateFromCsv(SCHEDULE, e.system_input, OPENINGS);
  if (!direct.ok) throw new Error(direct.errors.map(formatProblem).join('\n'));
  const totals = direct.result.totals;
  expect(e.result.totals).toEqual(totals);

  // 1. The estimate: one line per fitting at the engine's figure, in whole packs at the branch's pack price.
  const expected = fittings.map((role) => {
    const product = m.productOf(role);
    const quantity = ENGINE_FIGURE[role]!(totals);
    expect(quantity, `${role}: the roof needs some`).toBeGreaterThan(0);
    const packs = Math.ceil(quantity / product.pack_size - 1e-9);
    return { role, product, quantity, packs, total: packs * product.price };
  });
  for (const x of expected) {
    const line = e.lines.find((l) => l.category === x.role);
    expect(line, x.role).toMatchObject({
      product_id: x.product.id,
      sku: x.product.sku,
      quantity: x.quantity,
      unit: x.product.unit,
      pack_size: x.product.pack_size,
      packs: x.packs,
      unit_price: x.product.price,
      total: x.total,
    });
  }
  expect(e.not_counted).toEqual([]);
  expect(e.totals.subtotal).toBe(e.lines.reduce((s, l) => s + (l.total ?? 0), 0));

  // 2. A quote: the desk prices every line with the system's product; packs and prices default to the branch's.
  const asked = await c.post('/api/quote-requests', { estimate_id: e.id, branch_ids: [m.branchId], requested_date: inDays(9), time_window: '07:30-12:00', delivery_method: 'ground' });
  expect(asked.status, JSON.stringify(asked.body)).toBe(201);
  const requestLines = quoteRequestSchema.parse(asked.body).lines;
  for (const x of expected)
    expect(
      requestLines.find((l) => l.category === x.role),
      x.role,
    ).toMatchObject({ quantity: x.quantity, unit: x.product.unit });
  const desk = await login(m.salesEmail);
  const answered = await desk.post(`/api/quotes/${asked.body.quotes[0].id}/answer`, {
    lines: requestLines.map((l) => ({ request_line_id: l.id, product_id: e.lines.find((el) => el.category === l.category)!.product_id })),
    valid_until: inDays(20),
  });
  expect(answered.status, JSON.stringify(answered.body)).toBe(200);
  const quote = answered.body.quotes[0];
  for (const x of expected) {
    const ql = quote.lines.find((l: { request_line_id: number }) => l.request_line_id === requestLines.find((r) => r.category === x.role)!.id);
    expect(ql, x.role).toMatchObject({ sku: x.product.sku, packs: x.packs, unit_price: x.product.price, total: x.total });
  }
  const accepted = await c.post(`/api/quotes/${quote.id}/accept`);
  expect(accepted.status, JSON.stringify(accepted.body)).toBe(201);
  const fromQuote = orderDetailSchema.parse((await c.get(`/api/orders/${accepted.body.order.id}`)).body);
  for (const x of expected)
    expect(
      fromQuote.lines.find((l) => l.category === x.role),
      x.role,
    ).toMatchObject({ sku: x.product.sku, quantity: x.packs, unit_price: x.product.price, total: x.total });

  // 3. An order placed straight from the estimate: the estimate's packs at the branch's prices.
  const placed = await c.post('/api/orders', { estimate_id: e.id, branch_id: m.branchId, requested_date: inDays(3), time_window: '07:30-12:00', delivery_method: 'ground' });
  expect(placed.status, JSON.stringify(placed.body)).toBe(201);
  const order = orderDetailSchema.parse(placed.body);
  for (const x of expected)
    expect(
      order.lines.find((l) => l.category === x.role),
      x.role,
    ).toMatchObject({ product_id: x.product.id, quantity: x.packs, pack_size: x.product.pack_size, unit_price: x.product.price, total: x.total });

  // 4. The desk confirms it onto a lorry; the driver's loading sheet carries every fitting, on the pallets too.
  const yard = await login(m.dispatcherEmail);
  const lorry = await yard.post(`/api/branches/${m.branchId}/lorries`, { registration: `RL-FT${String(m.branchId).padStart(2, '0')}`, payload_kg: 26000, pallet_slots: 26 });
  expect(lorry.status, JSON.stringify(lorry.body)).toBe(201);
  const slot = await yard.post(`/api/branches/${m.branchId}/slots`, { lorry_id: lorry.body.id, date: inDays(3), time_window: '07:30-12:00' });
  expect(slot.status, JSON.stringify(slot.body)).toBe(201);
  const confirmed = await desk.post(`/api/orders/${order.id}/confirm`, { slot_id: slot.body.id });
  expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(200);
  expect((await yard.patch(`/api/slots/${slot.body.id}`, { driver_id: m.driverId })).status).toBe(200);
  const sheet = loadingSheetSchema.parse((await yard.get(`/api/deliveries?date=${inDays(3)}&driver_id=${m.driverId}`)).body);
  const stop = sheet.runs[0].stops.find((s) => s.order_id === order.id)!;
  const palletItems = stop.pallets.flatMap((p) => p.items);
  for (const x of expected) {
    const line = order.lines.find((l) => l.category === x.role)!;
    expect(
      stop.lines.find((l) => l.line_id === line.id),
      x.role,
    ).toMatchObject({ sku: x.product.sku, quantity: x.packs, unit: x.product.unit });
    // What the pallets carry of it: every unit of the packs sent (metres for the products sold by the metre).
    const carried = palletItems.filter((i) => ITEM_OF[x.role] === i.item).reduce((s, i) => s + i.quantity, 0);
    expect(carried, x.role).toBeCloseTo(x.packs * x.product.pack_size, 6);
  }

  // 5. The exports: the bill as CSV and as a workbook, each fitting at its quantity, packs, pack price and total.
  const csv = await c.agent.get(`/api/estimates/${e.id}/export.csv`);
  expect(csv.status).toBe(200);
  const rows = Papa.parse<Record<string, string>>(csv.text.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true }).data;
  const xlsx = await c.agent.get(`/api/estimates/${e.id}/export.xlsx`).buffer(true).parse(binary);
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(xlsx.body as ArrayBuffer);
  const bill = wb.getWorksheet('Bill of materials')!;
  const headers = (bill.getRow(1).values as unknown[]).slice(1);
  const cell = (row: number, header: string) => bill.getRow(row).getCell(headers.indexOf(header) + 1).value;
  for (const x of expected) {
    const row = rows.find((r) => r.SKU === x.product.sku);
    expect(row, x.role).toMatchObject({ Quantity: String(x.quantity), Unit: x.product.unit, Packs: String(x.packs), 'Pack price': String(x.product.price / 100), Total: String(x.total / 100) });
    let n = 2;
    while (n <= bill.rowCount && cell(n, 'SKU') !== x.product.sku) n++;
    expect(cell(n, 'Quantity'), x.role).toBe(x.quantity);
    expect([cell(n, 'Packs'), cell(n, 'Pack price'), cell(n, 'Total')], x.role).toEqual([x.packs, x.product.price / 100, x.total / 100]);
  }
  return { estimate: e as Estimate, totals };
}

/** The pallet item each fitting travels as: the engine's own name where it palletises it, else the product's category. */
const ITEM_OF: Partial<Record<SystemRole, string>> = {
  eaves_tile: 'eaves_tiles',
  top_tile: 'top_tiles',
  tile_and_half: 'tile_and_half',
  dry_verge: 'dry_verge_units',
  ridge_end_cap: 'ridge_end_caps',
  hip_iron: 'hip_irons',
  valley_trough: 'valley_units',
  eaves_vent: 'eaves_vent',
  verge_undercloak: 'verge_undercloak',
  flashing: 'flashing',
};

describe('every fitting product from the estimate to the lorry and the exports', () => {
  it('a plain tile roof with mortar verges: eaves and top tiles, tiles-and-a-half, hip irons, eaves ventilation, verge undercloak and flashing', async () => {
    const { totals } = await journey(TOLLERBECK, 'Kilnworth clay plain tile roof', ['eaves_tile', 'top_tile', 'tile_and_half', 'hip_iron', 'eaves_vent', 'verge_undercloak', 'flashing']);
    // Four hips, an iron at the foot of each (common practice); the porch's wall 2.4 m (geometry).
    expect(totals.hip_irons).toBe(4);
    expect(totals.flashings.top_abutment_m).toBe(2.4);
  });

  it('an interlocking tile roof with dry verges and trough valleys: verge units, ridge end caps, hip irons, valley troughs, eaves ventilation and flashing, and no undercloak', async () => {
    const { estimate, totals } = await journey(CADDONMERE, 'Wharf-Lock 380 interlocking tile roof', ['dry_verge', 'ridge_end_cap', 'hip_iron', 'valley_trough', 'eaves_vent', 'flashing']);
    // Dry verge units are their own product: the verges' metres price no undercloak strip.
    expect(totals.verge_m).toBeGreaterThan(0);
    expect(estimate.lines.some((l) => l.category === 'verge_undercloak')).toBe(false);
    expect(estimate.lines.some((l) => l.category === 'valley')).toBe(false);
  });
});
