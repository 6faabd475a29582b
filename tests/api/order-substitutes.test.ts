import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { orderDetailSchema, substituteOptionsSchema } from '../../shared/schemas/order.schema';
import { createTestApp, type TestApp } from '../setup/test-app';
import { contractorWithEstimate, merchantWithCatalogue, orderBody, type TestMerchant } from '../setup/order-scenario';
import { GABLE_CSV, signIn } from '../setup/scenario';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const TILE = 'TRS-FL420-SG';
const PLAIN = 'TRS-KP265-BR';
const BATTEN = 'TRS-BAT-3825';
const WITH_PORCH = `${GABLE_CSV.trimEnd()}\nPorch,Front,1,30,1500,2400,verge,verge,abutment\n`;

async function orderFor(m: TestMerchant, csv = GABLE_CSV) {
  const k = await contractorWithEstimate(t, m, {}, csv);
  const placed = orderDetailSchema.parse((await k.c.post('/api/orders', orderBody(k, m))).body);
  const desk = await signIn(t.app, m.salesEmail);
  return { k, desk, placed, tile: placed.lines.find((l) => l.sku === TILE)! };
}

describe('a substitute tile is offered only with the engine figures for the order’s own roof', () => {
  it('marks and refuses a plain tile for a roof with a face below its lowest pitch, naming the face', async () => {
    const m = await merchantWithCatalogue(t);
    const { desk, placed, tile } = await orderFor(m, WITH_PORCH);
    const res = await desk.get(`/api/orders/${placed.id}/lines/${tile.id}/substitutes`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const plain = substituteOptionsSchema.parse(res.body).options.find((o) => o.sku === PLAIN)!;
    // Plain tiles: lowest pitch 35° (NHBC Standards 7.2.19, "Pitch, gauge and lap"); the porch is at 30°.
    expect(plain.suitable).toBe(false);
    expect(plain.figures?.tile.lowest_pitch_deg).toBe(35);
    expect(plain.figures?.refused_faces).toEqual([expect.objectContaining({ building: 'Porch', face: 'Front', pitch_deg: 30 })]);
    expect(plain.reason).toContain('Porch Front');

    const offered = await desk.post(`/api/orders/${placed.id}/proposals`, {
      revision: placed.revision,
      lines: [{ line_id: tile.id, confirmed_quantity: 0, back_order_quantity: 0, substitute: { product_id: m.product(PLAIN), quantity: tile.quantity } }],
    });
    expect(offered.status).toBe(422);
    expect(JSON.stringify(offered.body.error.details)).toContain('Porch Front: 30° is below the lowest pitch');
  });

  it('offers a plain tile on a roof it suits with the engine’s count, the battens and fixings that change and the price difference', async () => {
    const m = await merchantWithCatalogue(t);
    const { k, desk, placed, tile } = await orderFor(m);
    const options = substituteOptionsSchema.parse((await desk.get(`/api/orders/${placed.id}/lines/${tile.id}/substitutes`)).body).options;
    const plain = options.find((o) => o.sku === PLAIN)!;
    expect(plain.suitable).toBe(true);
    const f = plain.figures!;
    // 2 faces of 8 m × 5 m = 80 m² of slope; plain tiles 265 × 165 at 100 mm gauge lay 60.6 a m²
    // (TRADE.md, lap and gauge: gauge = (length − headlap) ÷ 2), before cuts and waste. The first
    // (eaves) and last (top) course of each face are short tiles ordered as lines of their own
    // (common practice, no source): 2 faces × 2 courses × ⌈8000 ÷ 165⌉ pieces come off the full tiles.
    const shortCourses = 2 * 2 * Math.ceil(8000 / 165);
    expect(plain.quantity).toBeGreaterThanOrEqual(Math.floor(80 * 60.6) - shortCourses);
    expect(plain.quantity).toBeLessThan(80 * 60.6 * 1.2);
    const row = (role: string) => f.rows.find((r) => r.role === role)!;
    expect(row('tile')).toMatchObject({ changes: true, before: { sku: TILE }, after: { sku: PLAIN, packs: plain.quantity } });
    // 10 m of batten a m² at 100 mm gauge against about 2.9 m at the interlocking tile's 345 mm (same source).
    expect(row('batten').after!.packs).toBeGreaterThan(3 * row('batten').before!.packs);
    expect(row('tile_nail').changes).toBe(true);
    expect(f.refused_faces).toEqual([]);
    expect(f.price_difference_minor).toBe(f.after_total - f.before_total);
    expect(f.after_total).toBe(f.rows.reduce((s, r) => s + (r.after?.total ?? 0), 0));

    // A quantity other than the engine's is refused, saying the engine's.
    const wrong = await desk.post(`/api/orders/${placed.id}/proposals`, {
      revision: placed.revision,
      lines: [{ line_id: tile.id, confirmed_quantity: 0, back_order_quantity: 0, substitute: { product_id: m.product(PLAIN), quantity: tile.quantity } }],
    });
    expect(wrong.status).toBe(422);
    expect(JSON.stringify(wrong.body.error.details)).toContain(`the engine counts ${plain.quantity} packs`);

    const offered = await desk.post(`/api/orders/${placed.id}/proposals`, {
      revision: placed.revision,
      lines: [{ line_id: tile.id, confirmed_quantity: 0, back_order_quantity: 0, substitute: { product_id: m.product(PLAIN), quantity: plain.quantity } }],
    });
    expect(offered.status, JSON.stringify(offered.body)).toBe(201);

    // The contractor sees the same figures, side by side, before accepting.
    const seen = orderDetailSchema.parse((await k.c.get(`/api/orders/${placed.id}`)).body);
    const sub = seen.proposals[0].lines[0].substitute!;
    expect(sub.figures).toEqual(f);

    const acceptRes = await k.c.post(`/api/orders/${placed.id}/proposals/${offered.body.proposal_id}/accept`, {});
    expect(acceptRes.status, JSON.stringify(acceptRes.body)).toBe(200);
    const accepted = orderDetailSchema.parse(acceptRes.body);
    const battens = accepted.lines.find((l) => l.sku === BATTEN)!;
    const battenBefore = placed.lines.find((l) => l.sku === BATTEN)!;
    expect(battens.quantity).toBe(battenBefore.quantity + row('batten').after!.packs - row('batten').before!.packs);
    expect(accepted.lines.find((l) => l.sku === PLAIN)).toMatchObject({ status: 'substitute', quantity: plain.quantity });
    expect(accepted.lines.find((l) => l.id === tile.id)).toMatchObject({ status: 'replaced', now_quantity: 0 });
  });

  it('refuses a substitute tile for part of a tile line: two tiles are not laid on one roof', async () => {
    const m = await merchantWithCatalogue(t);
    const { desk, placed, tile } = await orderFor(m);
    const res = await desk.post(`/api/orders/${placed.id}/proposals`, {
      revision: placed.revision,
      lines: [{ line_id: tile.id, confirmed_quantity: 10, back_order_quantity: 0, substitute: { product_id: m.product(PLAIN), quantity: 100 } }],
    });
    expect(res.status).toBe(422);
    expect(res.body.error.details[0]).toMatchObject({ path: 'lines.0.substitute' });
  });

  it('keeps pack arithmetic for a substitute that is not a tile', async () => {
    const m = await merchantWithCatalogue(t);
    const { desk, placed } = await orderFor(m);
    const ridge = placed.lines.find((l) => l.category === 'ridge')!;
    const options = substituteOptionsSchema.parse((await desk.get(`/api/orders/${placed.id}/lines/${ridge.id}/substitutes`)).body).options;
    const clay = options.find((o) => o.sku === 'TRS-RCL-BR')!;
    expect(clay).toMatchObject({ suitable: true, figures: null, quantity: Math.ceil((ridge.quantity * ridge.pack_size) / clay.pack_size) });
  });

  it('answers the contractor and another merchant as not theirs to ask', async () => {
    const m = await merchantWithCatalogue(t);
    const { k, placed, tile } = await orderFor(m);
    expect((await k.c.get(`/api/orders/${placed.id}/lines/${tile.id}/substitutes`)).status).toBe(403);
    const other = await merchantWithCatalogue(t);
    const stranger = await signIn(t.app, other.salesEmail);
    expect((await stranger.get(`/api/orders/${placed.id}/lines/${tile.id}/substitutes`)).status).toBe(404);
  });
});
