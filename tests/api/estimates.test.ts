import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, kindOfRole } from '../../shared/domain/roles';
import { SAFETY_CAUTIONS } from '../../shared/engine/defaults';
import { estimate } from '../../shared/engine/estimate';
import { EXAMPLE_SCHEDULE_CSV } from '../../shared/engine/example-schedule';
import { ENGINE_VERSION } from '../../shared/engine/version';
import { roofSystemOfferSchema, systemsListSchema, merchantBranchesListSchema } from '../../shared/schemas/catalogue.schema';
import { estimateComparisonSchema, estimateListSchema, estimateSchema } from '../../shared/schemas/estimate.schema';
import { roofSystemSchema } from '../../shared/schemas/roof-system.schema';
import { scheduleSchema } from '../../shared/schemas/schedule.schema';
import { DEMO_CATALOGUES, installCatalogue } from '../../seeds/02-catalogue';
import { Client, createTestApp, type TestApp } from '../setup/test-app';
import { makeOrgWithUser, makeUser, TEST_PASSWORD } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const [TOLLERBECK, CADDONMERE] = DEMO_CATALOGUES;

async function signedIn(kind: 'contractor' | 'merchant' = 'contractor', role: (typeof ROLES)[number] = 'contractor_estimator', organisationId?: number) {
  const u = organisationId ? { organisationId, ...(await makeUser(t.db, organisationId, role)) } : await makeOrgWithUser(t.db, kind, role);
  const c = new Client(t.app);
  expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
  return { ...u, c };
}

/** A merchant with one branch selling the given demo catalogue; returns its systems by name. */
async function merchant(catalogue = TOLLERBECK) {
  const m = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
  const installed = await installCatalogue(t.db, m.organisationId, [{ id: m.branchId!, priceFactor: 1, stockFactor: 1 }], catalogue);
  const system = (name: string) => installed.systemIds.find((s) => s.name === name)!.id;
  return { ...m, ...installed, system };
}

const INTERLOCKING = TOLLERBECK.systems[0].name;
const PLAIN_TILE = TOLLERBECK.systems[1].name;

async function siteWith(c: Client, csv: string) {
  const p = await c.post('/api/projects', { name: 'Sallowmere Rise', site_address: 'Sallowmere Rise, Tollerbeck' });
  const token = await c.csrf();
  const s = await c.agent.post(`/api/projects/${p.body.id}/schedule`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(csv);
  expect(s.status).toBe(201);
  return p.body.id as number;
}

/** One gable slope and its pair, 8 m at the eaves, 5 m up the rafter, at 40°. */
const GABLE_40 = ['building,face,quantity,pitch_deg,rafter_mm,eaves_mm,left,right,top', 'House,Front,1,40,5000,8000,verge,verge,ridge', 'House,Back,1,40,5000,8000,verge,verge,ridge', ''].join('\n');

const estimatesCount = async () => Number((await t.db('estimates').count({ n: '*' }).first())?.n);

describe('roof systems offered by merchant branches', () => {
  it('lists each branch’s systems with the engine input built from the products, components and pack prices', async () => {
    const m = await merchant();
    const { c } = await signedIn();
    const res = await c.get(`/api/systems?branch_id=${m.branchId}`);
    expect(res.status).toBe(200);
    const { systems } = systemsListSchema.parse(res.body);
    expect(systems.map((s) => s.name)).toEqual([INTERLOCKING, PLAIN_TILE]);
    const plain = systems[1];
    expect(plain.branch).toMatchObject({ id: m.branchId, merchant: { id: m.organisationId } });
    expect(plain.tile).toMatchObject({ kind: 'double_lap', length_mm: 265, width_mm: 165, headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }] });
    // The engine input takes the ridge, batten, underlay and nail figures from the products chosen.
    expect(plain.system.ridge).toEqual({ cover_mm: 430, weight_kg: 5.2 });
    expect(plain.system.batten).toMatchObject({ stock_length_mm: 4800, kg_per_m: 0.45 });
    expect(plain.system.fixing).toMatchObject({ batten_nail_g: 4.5, tile_nail_g: 1.5 });
    expect(plain.system.waste_pct.tiles).toBe(7);
    expect(roofSystemSchema.parse(plain.system)).toEqual(plain.system);
    expect(plain.prices).toMatchObject({ tile: 74, ridge: 1150, batten: 440, tile_nail: 2450 });
    expect(plain.components.find((x) => x.role === 'batten_nail')).toMatchObject({ product: { sku: 'TRS-NB65-1K', unit: 'nail', pack_size: 1000 }, unit_price: 1850, stock: 'in_stock' });

    const kind = await c.get(`/api/systems?branch_id=${m.branchId}&kind=single_lap`);
    expect(kind.body.systems.map((s: { name: string }) => s.name)).toEqual([INTERLOCKING]);
    const one = await c.get(`/api/systems/${plain.id}`);
    expect(roofSystemOfferSchema.parse(one.body)).toEqual(plain);
  });

  it('tells a contractor whether a component is in stock, low or out, without showing the counts', async () => {
    const m = await merchant();
    const tile = m.productIds.get('TRS-FL420-SG')!;
    await t.db('branch_products').where({ branch_id: m.branchId, product_id: tile }).update({ on_hand: 100, reserved: 100 });
    await t
      .db('branch_products')
      .where({ branch_id: m.branchId, product_id: m.productIds.get('TRS-RHR-SG') })
      .update({ on_hand: 100, reorder_level: 150 });
    const { c } = await signedIn();
    const s = (await c.get(`/api/systems/${m.system(INTERLOCKING)}`)).body;
    expect(s.components.find((x: { role: string }) => x.role === 'tile').stock).toBe('out_of_stock');
    expect(s.components.find((x: { role: string }) => x.role === 'ridge').stock).toBe('low');
    expect(JSON.stringify(s)).not.toMatch(/on_hand|reserved/);
  });

  it('leaves out a system whose branch does not price every component', async () => {
    const m = await merchant();
    await t
      .db('branch_products')
      .where({ branch_id: m.branchId, product_id: m.productIds.get('TRS-UVP-50') })
      .delete();
    const { c } = await signedIn();
    const list = (await c.get(`/api/systems?branch_id=${m.branchId}`)).body.systems;
    expect(list).toEqual([]);
    expect((await c.get(`/api/systems/${m.system(INTERLOCKING)}`)).status).toBe(404);
  });

  it('lists every merchant branch to choose from for an order or a quote request', async () => {
    const a = await merchant();
    const b = await merchant(CADDONMERE);
    const { c } = await signedIn();
    const res = await c.get('/api/merchant-branches');
    expect(res.status).toBe(200);
    merchantBranchesListSchema.parse(res.body);
    const ids = res.body.branches.map((x: { id: number }) => x.id);
    expect(ids).toEqual(expect.arrayContaining([a.branchId, b.branchId]));
    expect(res.body.branches.find((x: { id: number }) => x.id === b.branchId)).toEqual({ id: b.branchId, name: expect.any(String), town: 'Testbury', merchant: { id: b.organisationId, name: expect.any(String) } });
  });

  it('shows a merchant only its own systems, and refuses drivers', async () => {
    const mine = await merchant();
    const other = await merchant(CADDONMERE);
    const sales = await signedIn('merchant', 'merchant_sales', mine.organisationId);
    const ids = (await sales.c.get('/api/systems')).body.systems.map((s: { id: number }) => s.id);
    expect(ids).toContain(mine.system(INTERLOCKING));
    expect(ids).not.toContain(other.system(CADDONMERE.systems[0].name));
    expect((await sales.c.get(`/api/systems/${other.system(CADDONMERE.systems[0].name)}`)).status).toBe(404);
    const driver = await signedIn('merchant', 'driver');
    expect((await driver.c.get('/api/systems')).status).toBe(403);
  });
});

describe('making an estimate', () => {
  it('prices the engine’s own figures: the stored result is what the shared engine gives for the schedule and system', async () => {
    const m = await merchant();
    const { c } = await signedIn();
    const pid = await siteWith(c, EXAMPLE_SCHEDULE_CSV);
    const res = await c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(INTERLOCKING) });
    expect(res.status).toBe(201);
    const e = estimateSchema.parse(res.body);

    const faces = (await c.get(`/api/projects/${pid}/schedule`)).body.faces.map(({ id: _i, position: _p, top_assumed: _t, ridge, ...f }: Record<string, unknown>) => (ridge === null ? f : { ...f, ridge }));
    const direct = estimate(scheduleSchema.parse(faces), e.system_input);
    expect(e.result).toEqual(direct);
    expect(e.engine_version).toBe(ENGINE_VERSION);

    const line = (category: string) => e.lines.find((l) => l.category === category)!;
    expect(line('tile')).toMatchObject({ sku: 'TRS-FL420-SG', quantity: direct.totals.tiles_order, packs: direct.totals.tiles_order, unit_price: 128 });
    expect(line('tile').total).toBe(direct.totals.tiles_order * 128);
    expect(line('ridge').quantity).toBe(direct.totals.ridge_tiles);
    expect(line('hip').quantity).toBe(direct.totals.hip_tiles);
    expect(line('batten')).toMatchObject({ quantity: direct.totals.batten_lengths, figure: 'batten_lengths' });
    // Nails come in boxes of 1000: whole boxes, rounded up (arithmetic).
    expect(line('batten_nail')).toMatchObject({ quantity: direct.totals.batten_nails, pack_size: 1000, packs: Math.ceil(direct.totals.batten_nails / 1000) });
    expect(line('tile_nail').total).toBe(Math.ceil(direct.totals.tile_nails / 1000) * 2450);
    expect(line('underlay').quantity).toBe(direct.totals.underlay_rolls);
    expect(e.totals).toEqual({
      subtotal: e.lines.reduce((s, l) => s + (l.total ?? 0), 0),
      weight_kg: direct.totals.weight_kg,
      pallets: direct.pallets.length,
      loads: direct.loads.length,
    });
    // Clips are the engine's count (eaves and verges of a single-lap roof, common practice), in whole packs.
    expect(direct.totals.clips).toBeGreaterThan(0);
    expect(line('clip')).toMatchObject({ sku: 'TRS-CLP-FL', quantity: direct.totals.clips, figure: 'clips' });
    expect(line('clip').packs).toBe(Math.ceil(direct.totals.clips / line('clip').pack_size));
    // The system sells every fitting the roof needs: hip irons for the hipped houses, eaves ventilation, an
    // undercloak for the mortar verges and flashing for the porch's wall, each priced by the engine's figure.
    expect(e.not_counted).toEqual([]);
    expect(line('hip_iron')).toMatchObject({ sku: 'TRS-HIR-GV', quantity: direct.totals.hip_irons, figure: 'hip_irons', total: direct.totals.hip_irons * 295 });
    expect(line('eaves_vent')).toMatchObject({ sku: 'TRS-EVC-5M', quantity: direct.totals.eaves_m, unit: 'm', packs: Math.ceil(direct.totals.eaves_m / 5) });
    expect(line('verge_undercloak')).toMatchObject({ sku: 'TRS-VUC-2M', quantity: direct.totals.verge_m, packs: Math.ceil(direct.totals.verge_m / 2) });
    expect(line('flashing')).toMatchObject({ sku: 'TRS-FLR-6M', quantity: direct.totals.flashings.top_abutment_m, figure: 'flashing_m' });
  });

  it('lays a plain tile roof at no more than the textbook gauge and about 10 m of batten per m²', async () => {
    const m = await merchant();
    const { c } = await signedIn();
    const pid = await siteWith(c, GABLE_40);
    const e = (await c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(PLAIN_TILE) })).body;
    const face = e.result.faces[0];
    // Double lap: gauge = (length − headlap) ÷ 2 = (265 − 65) ÷ 2 = 100 mm at most (TRADE.md "Lap and gauge",
    // public-domain building construction texts; NHBC 7.2.19 for the 65 mm headlap).
    expect(face.headlap_mm).toBe(65);
    expect(face.gauge_mm).toBeLessThanOrEqual(100);
    expect(face.gauge_mm).toBeGreaterThan(95);
    // Slope area of a rectangle: 8 m × 5 m (geometry).
    expect(face.slope_area_m2).toBeCloseTo(40, 6);
    // 100 mm gauge → 10 m of batten per m² (derived from the same rule in TRADE.md); the eaves course adds a row.
    expect(face.batten_m / face.slope_area_m2).toBeGreaterThan(9.5);
    expect(face.batten_m / face.slope_area_m2).toBeLessThan(10.8);
    // 1 ÷ (0.100 × 0.165) = 60.6 tiles per m² at 100 mm gauge (TRADE.md), counting each piece by the tile
    // widths it covers (a tile-and-a-half as 1.5); a slightly closer gauge and the eaves course add a few.
    const covering = face.tiles + face.eaves_tiles + face.top_tiles + 1.5 * face.tile_and_half;
    expect(covering / face.slope_area_m2).toBeGreaterThan(60.6);
    expect(covering / face.slope_area_m2).toBeLessThan(70);
    expect(face.half_tiles).toBe(0);
  });

  it('uses the waste asked for over the system’s own, and names a waste percentage out of range', async () => {
    const m = await merchant();
    const { c } = await signedIn();
    const pid = await siteWith(c, GABLE_40);
    const none = (await c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(INTERLOCKING), waste_pct: { tiles: 0 } })).body;
    expect(none.system_input.waste_pct).toMatchObject({ tiles: 0, battens: 10 });
    expect(none.result.totals.tiles_order).toBe(none.result.totals.tiles);
    expect(none.waste_pct).toEqual({ tiles: 0 });
    const before = await estimatesCount();
    const bad = await c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(INTERLOCKING), waste_pct: { tiles: 150 } });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details[0].path).toBe('waste_pct.tiles');
    expect(await estimatesCount()).toBe(before);
  });

  it('estimates a generic system typed in, without prices, and names a bad field of it', async () => {
    const { c } = await signedIn();
    const pid = await siteWith(c, GABLE_40);
    const res = await c.post(`/api/projects/${pid}/estimates`, {
      system: { tile: { kind: 'double_lap', length_mm: 265, width_mm: 165, headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }], weight_kg: 1.1, per_pallet: 800 } },
    });
    expect(res.status).toBe(201);
    expect(res.body.system).toMatchObject({ source: 'generic', id: null, branch: null });
    expect(res.body.totals.subtotal).toBeNull();
    expect(res.body.lines.every((l: { unit_price: null; sku: null }) => l.unit_price === null && l.sku === null)).toBe(true);
    expect(res.body.lines[0]).toMatchObject({ category: 'tile', quantity: res.body.result.totals.tiles_order, description: 'Double-lap tile 265 × 165 mm' });

    const bad = await c.post(`/api/projects/${pid}/estimates`, { system: { tile: { kind: 'double_lap', length_mm: -265 } } });
    expect(bad.status).toBe(422);
    expect(bad.body.error.code).toBe('invalid_system');
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toContain('system.tile.length_mm');
  });

  it('refuses a schedule with a face below the tile’s lowest pitch, naming the row and face, and stores nothing', async () => {
    const m = await merchant();
    const { c } = await signedIn();
    const pid = await siteWith(c, EXAMPLE_SCHEDULE_CSV);
    const before = await estimatesCount();
    const res = await c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(PLAIN_TILE) });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('schedule_not_suitable');
    // The example's porch is at 25°; plain tiles need 35° (NHBC 7.2.19 minimum pitch for plain tiles).
    expect(res.body.error.details).toEqual([expect.objectContaining({ row: 7, column: 'pitch_deg', building: 'Birch', face: 'Porch' })]);
    expect(await estimatesCount()).toBe(before);
  });

  it('needs a schedule first, and exactly one of system_id and system', async () => {
    const m = await merchant();
    const { c } = await signedIn();
    const { id } = (await c.post('/api/projects', { name: 'Empty', site_address: 'Nowhere Lane' })).body;
    const none = await c.post(`/api/projects/${id}/estimates`, { system_id: m.system(INTERLOCKING) });
    expect(none.status).toBe(409);
    expect(none.body.error.code).toBe('no_schedule');
    const pid = await siteWith(c, GABLE_40);
    expect((await c.post(`/api/projects/${pid}/estimates`, {})).body.error.details[0].path).toBe('system_id');
    expect((await c.post(`/api/projects/${pid}/estimates`, { system_id: 1, system: {} })).status).toBe(422);
    expect((await c.post(`/api/projects/${pid}/estimates`, { system_id: 999999 })).status).toBe(404);
  });

  it('carries the cautions for work at height and roof loading and defers to the fixing specification', async () => {
    const m = await merchant();
    const { c } = await signedIn();
    const pid = await siteWith(c, GABLE_40);
    const e = (await c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(INTERLOCKING) })).body;
    for (const caution of SAFETY_CAUTIONS) expect(e.cautions).toContain(caution);
    expect(e.cautions.join(' ')).toMatch(/fixing specification/);
    expect(e.cautions.join(' ')).toMatch(/height/);
  });
});

describe('reopening, recomputing and comparing', () => {
  it('reopens with the same figures after prices change, and recomputes only when asked', async () => {
    const m = await merchant();
    const { c } = await signedIn();
    const pid = await siteWith(c, GABLE_40);
    const first = (await c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(INTERLOCKING) })).body;
    await t
      .db('branch_products')
      .where({ branch_id: m.branchId, product_id: m.productIds.get('TRS-FL420-SG') })
      .update({ pack_price: 150 });
    await t.db('estimates').where({ id: first.id }).update({ engine_version: '0.9.0' });

    const reopened = await c.get(`/api/estimates/${first.id}`);
    expect(reopened.status).toBe(200);
    expect({ ...reopened.body, engine_version: first.engine_version, engine_current: true }).toEqual(first);
    expect(reopened.body).toMatchObject({ engine_version: '0.9.0', engine_current: false });

    const again = await c.post(`/api/estimates/${first.id}/recompute`);
    expect(again.status).toBe(201);
    expect(again.body).toMatchObject({ recomputed_from: first.id, engine_version: ENGINE_VERSION, engine_current: true });
    expect(again.body.id).not.toBe(first.id);
    expect(again.body.lines[0]).toMatchObject({ sku: 'TRS-FL420-SG', unit_price: 150 });

    const list = estimateListSchema.parse((await c.get(`/api/projects/${pid}/estimates`)).body);
    expect(list.estimates.map((x) => x.id)).toEqual([again.body.id, first.id]);
    expect((await c.get(`/api/projects/${pid}`)).body.estimate_count).toBe(2);
  });

  it('compares two systems on the same schedule: quantities, weight and price side by side', async () => {
    const a = await merchant();
    const b = await merchant(CADDONMERE);
    const { c } = await signedIn();
    const pid = await siteWith(c, GABLE_40);
    const ea = (await c.post(`/api/projects/${pid}/estimates`, { system_id: a.system(INTERLOCKING) })).body;
    const eb = (await c.post(`/api/projects/${pid}/estimates`, { system_id: b.system(CADDONMERE.systems[1].name) })).body;
    const res = await c.get(`/api/estimates/compare?a=${ea.id}&b=${eb.id}`);
    expect(res.status).toBe(200);
    const cmp = estimateComparisonSchema.parse(res.body);
    expect(cmp.estimates.map((e) => e.id)).toEqual([ea.id, eb.id]);
    const tiles = cmp.rows.find((r) => r.category === 'tile')!;
    expect(tiles.a?.quantity).toBe(ea.result.totals.tiles_order);
    expect(tiles.b?.quantity).toBe(eb.result.totals.tiles_order);
    expect(tiles.b?.sku).toBe('CTT-SL5025-BG');
    expect(cmp.difference).toEqual({
      subtotal: eb.totals.subtotal - ea.totals.subtotal,
      weight_kg: Math.round((eb.totals.weight_kg - ea.totals.weight_kg) * 10) / 10,
      pallets: eb.totals.pallets - ea.totals.pallets,
    });
  });

  it('refuses to compare estimates of different schedule versions', async () => {
    const m = await merchant();
    const { c } = await signedIn();
    const pid = await siteWith(c, GABLE_40);
    const first = (await c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(INTERLOCKING) })).body;
    const token = await c.csrf();
    await c.agent.post(`/api/projects/${pid}/schedule`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(GABLE_40.replace('8000', '9000'));
    const second = (await c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(INTERLOCKING) })).body;
    expect(second.schedule.version).toBe(2);
    const res = await c.get(`/api/estimates/compare?a=${first.id}&b=${second.id}`);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('not_comparable');
  });
});

describe('no role reaches another contractor’s estimates', () => {
  for (const role of ROLES) {
    it(`${role}: reading, recomputing, comparing and estimating on another firm’s site is refused`, async () => {
      const m = await merchant();
      const owner = await signedIn('contractor', 'contractor_owner');
      const pid = await siteWith(owner.c, GABLE_40);
      const e = (await owner.c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(INTERLOCKING) })).body;
      const before = await estimatesCount();
      const actor = await signedIn(kindOfRole(role), role);
      const attempts = [
        await actor.c.get(`/api/estimates/${e.id}`),
        await actor.c.post(`/api/estimates/${e.id}/recompute`),
        await actor.c.get(`/api/estimates/compare?a=${e.id}&b=${e.id}`),
        await actor.c.get(`/api/projects/${pid}/estimates`),
        await actor.c.post(`/api/projects/${pid}/estimates`, { system_id: m.system(INTERLOCKING) }),
      ];
      for (const res of attempts) expect([403, 404], `${role}: ${res.status}`).toContain(res.status);
      expect(await estimatesCount()).toBe(before);
    });
  }
});
