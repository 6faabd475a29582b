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
    // A hipped roof has no verge and no wall: of the metre totals only its eaves are left, and this system has no product for them.
    expect(not_counted.map((n) => n.category)).toEqual(['eaves_vent']);
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

  describe('by the metre: eaves ventilation, verge undercloak and flashing', () => {
    /** A gable pair 8 m at the eaves and 5 m up the rafter, and a lean-to porch 2.4 m wide against a wall. */
    const GABLE_AND_PORCH = [
      'building,face,quantity,pitch_deg,rafter_mm,eaves_mm,left,right,top',
      'House,Front,1,40,5000,8000,verge,verge,ridge',
      'House,Back,1,40,5000,8000,verge,verge,ridge',
      'House,Porch,1,25,1800,2400,verge,verge,abutment',
      '',
    ].join('\n');
    const metreProducts = () =>
      new Map<SystemRole, PricedComponent>([
        ['eaves_vent', component(11, 'EV', 'm', 3, 540)],
        ['verge_undercloak', component(12, 'VU', 'm', 2, 310)],
        ['flashing', component(13, 'FL', 'm', 6, 2150)],
      ]);
    const gable = (input: unknown = {}) => {
      const out = runEstimateFromCsv(GABLE_AND_PORCH, input);
      if (!out.ok) throw new Error('example does not estimate');
      return { result: out.result, system: roofSystemSchema.parse(input) };
    };

    it('prices the engine’s eaves, mortar verge and flashing metres in whole lengths of each product', () => {
      const { result, system: s } = gable();
      const { lines, not_counted } = billOfMaterials(result, s, metreProducts());
      const line = (c: string) => lines.find((l) => l.category === c);
      // Geometry: eaves 8 + 8 + 2.4 = 18.4 m; verges are the rafters, 4 × 5 + 2 × 1.8 = 23.6 m; the porch's wall 2.4 m.
      expect(result.totals).toMatchObject({ eaves_m: 18.4, verge_m: 23.6, flashings: { top_abutment_m: 2.4 } });
      expect(line('eaves_vent')).toMatchObject({ figure: 'eaves_m', quantity: 18.4, unit: 'm', pack_size: 3, packs: 7, unit_price: 540, total: 7 * 540 });
      expect(line('verge_undercloak')).toMatchObject({ figure: 'verge_m', quantity: 23.6, unit: 'm', pack_size: 2, packs: 12, total: 12 * 310 });
      expect(line('flashing')).toMatchObject({ figure: 'flashing_m', quantity: 2.4, packs: 1, total: 2150 });
      expect(not_counted.map((n) => n.category)).not.toContain('eaves_vent');
    });

    it('counts no undercloak with dry verges, whose units are their own line', () => {
      const { result, system: s } = gable({ verge: { kind: 'dry' } });
      expect(result.totals.verge_m).toBe(23.6);
      expect(result.totals.dry_verge_units).toBeGreaterThan(0);
      const { lines, not_counted } = billOfMaterials(result, s, metreProducts());
      expect(lines.some((l) => l.category === 'verge_undercloak')).toBe(false);
      expect(not_counted.map((n) => n.category)).not.toContain('verge_undercloak');
      expect(not_counted.map((n) => n.category)).toContain('dry_verge');
    });

    it('sums the four flashing runs to the centimetre on one line', () => {
      const result = { ...run() };
      result.totals = { ...result.totals, flashings: { side_abutment_m: 1.1, top_abutment_m: 2.2, apron_m: 0.35, back_gutter_m: 0.35 } };
      const { lines } = billOfMaterials(result, system, metreProducts());
      expect(lines.find((l) => l.category === 'flashing')).toMatchObject({ quantity: 4, packs: 1 });
    });

    it('lists each metre total apart when the system has no product for it, and gives a generic system generic lines', () => {
      const { result, system: s } = gable();
      const { not_counted } = billOfMaterials(result, s, new Map([['tile', component(1, 'T', 'tile', 1, 100)]]));
      expect(not_counted.find((n) => n.category === 'eaves_vent')?.message).toBe('the roof needs 18.4 m of eaves ventilation, but this system has no such product: add it to the order by hand');
      expect(not_counted.map((n) => n.category)).toEqual(expect.arrayContaining(['verge_undercloak', 'flashing']));
      const generic = billOfMaterials(result, s, null).lines;
      expect(generic.filter((l) => l.unit === 'm').map((l) => [l.category, l.quantity, l.description])).toEqual([
        ['eaves_vent', 18.4, 'Eaves ventilation strip or comb filler, by the metre along the eaves'],
        ['verge_undercloak', 23.6, 'Verge undercloak strip, by the metre along the mortar verges'],
        ['flashing', 2.4, 'Flashing, by the metre: abutments, aprons and back gutters'],
      ]);
    });
  });
});
