import { describe, expect, it } from 'vitest';
import { runEstimateFromCsv } from '../../../shared/engine/estimate';
import { roofSystemSchema } from '../../../shared/schemas/roof-system.schema';
import type { SystemRole } from '../../../shared/schemas/catalogue.schema';
import { billOfMaterials, packsFor, type PricedComponent } from './bill-of-materials';

const CSV = [
  'building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top',
  'A,Front,1,35,,4200,10200,1800,hip,hip,ridge',
  'A,Back,1,35,,4200,10200,1800,hip,hip,ridge',
  'A,East,1,35,,4200,8400,0,hip,hip,ridge',
  'A,West,1,35,,4200,8400,0,hip,hip,ridge',
  '',
].join('\n');

function run() {
  const out = runEstimateFromCsv(CSV);
  if (!out.ok) throw new Error('example does not estimate');
  return out.result;
}

const component = (id: number, sku: string, unit: string, packSize: number, price: number): PricedComponent => ({
  product: { id, sku, name: sku, unit, pack_size: packSize },
  pack_price: price,
});

describe('packsFor', () => {
  it('rounds up to whole packs without floating-point slips', () => {
    expect(packsFor(2000, 1000)).toBe(2);
    expect(packsFor(2001, 1000)).toBe(3);
    expect(packsFor(0.3 * 3, 0.9)).toBe(1);
    expect(packsFor(0, 1000)).toBe(0);
  });
});

describe('billOfMaterials', () => {
  const system = roofSystemSchema.parse({});

  it('lays the ridge piece on the hips when the system has no hip product, on one line', () => {
    const result = run();
    const components = new Map<SystemRole, PricedComponent>([
      ['tile', component(1, 'T', 'tile', 1, 100)],
      ['ridge', component(2, 'R', 'piece', 1, 500)],
      ['batten', component(3, 'B', 'length', 1, 400)],
      ['batten_nail', component(4, 'BN', 'nail', 1000, 1800)],
      ['tile_nail', component(5, 'TN', 'nail', 1000, 2400)],
      ['clip', component(7, 'C', 'clip', 100, 900)],
      ['underlay', component(6, 'U', 'roll', 1, 6000)],
      ['hip_iron', component(8, 'HI', 'piece', 1, 350)],
    ]);
    const { lines, not_counted } = billOfMaterials(result, system, components);
    // A hipped roof has four hips, each with an iron at its foot (common practice, no source).
    expect(lines.find((l) => l.category === 'hip_iron')).toMatchObject({ quantity: 4, figure: 'hip_irons', total: 4 * 350 });
    // Clips are the engine's count, bought in whole packs.
    expect(lines.find((l) => l.category === 'clip')).toMatchObject({ quantity: result.totals.clips, packs: Math.ceil(result.totals.clips / 100), figure: 'clips' });
    expect(result.totals.hip_tiles).toBeGreaterThan(0);
    const ridge = lines.find((l) => l.category === 'ridge')!;
    expect(ridge).toMatchObject({ quantity: result.totals.ridge_tiles + result.totals.hip_tiles, figure: 'ridge_and_hip_tiles' });
    expect(lines.some((l) => l.category === 'hip')).toBe(false);
    expect(lines.find((l) => l.category === 'batten_nail')).toMatchObject({ packs: Math.ceil(result.totals.batten_nails / 1000), total: Math.ceil(result.totals.batten_nails / 1000) * 1800 });
    expect(not_counted).toEqual([]);
  });

  it('lists a counted item with no product apart instead of dropping it', () => {
    const result = { ...run() };
    result.totals = { ...result.totals, valley_m: 6.2 };
    const { lines, not_counted } = billOfMaterials(result, system, new Map([['tile', component(1, 'T', 'tile', 1, 100)]]));
    expect(lines.map((l) => l.category)).toEqual(['tile']);
    expect(not_counted.map((n) => n.category)).toContain('valley');
    expect(not_counted.map((n) => n.category)).toContain('clip');
    expect(not_counted.find((n) => n.category === 'hip_iron')?.message).toBe('the roof needs 4 piece of hip irons, but this system has no such product: add it to the order by hand');
  });

  it('orders trough valleys as units instead of valley lining, and a slate roof’s special pieces as their own lines', () => {
    const result = { ...run() };
    result.totals = { ...result.totals, valley_m: 6.2, valley_units: 3, eaves_tiles_order: 42, top_tiles_order: 42, tile_and_half_order: 32, dry_verge_units: 60, ridge_end_caps: 2 };
    const { lines } = billOfMaterials(result, system, null);
    const byFigure = Object.fromEntries(lines.map((l) => [l.figure, l.quantity]));
    expect(byFigure).toMatchObject({ valley_units: 3, eaves_tiles_order: 42, top_tiles_order: 42, tile_and_half_order: 32, dry_verge_units: 60, ridge_end_caps: 2 });
    expect(byFigure.valley_m).toBeUndefined();
  });

  it('gives a generic system the engine quantities with no prices', () => {
    const result = run();
    const { lines } = billOfMaterials(result, system, null);
    expect(lines.every((l) => l.unit_price === null && l.total === null && l.product_id === null)).toBe(true);
    expect(lines.find((l) => l.category === 'tile')!.quantity).toBe(result.totals.tiles_order);
  });
});
