import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { deckGeometry, planDeck, type DeckDrop, type DeckLorry } from './deck-plan';

const rigid = (over: Partial<DeckLorry> = {}): DeckLorry => ({
  registration: 'RL12 ABC',
  payload_kg: 10_000,
  pallet_slots: 12,
  has_crane: false,
  crane_max_kg: null,
  deck_length_mm: 7300,
  deck_width_mm: 2450,
  ...over,
});

const drop = (orderId: number, weights: number[], method: 'ground' | 'roof' = 'ground'): DeckDrop => ({
  order_id: orderId,
  reference: `RL-${String(orderId).padStart(6, '0')}`,
  delivery_method: method,
  pallets: weights.map((w, i) => ({ n: i + 1, weight_kg: w, faces: [{ building: 'A', face: `Face ${i + 1}`, tiles: 100 }] })),
});

describe('deck geometry', () => {
  it('fits 1200 × 1000 mm pallets two abreast on a 7300 × 2450 mm rigid deck, turned for seven rows', () => {
    // ISO 6780 lists 1200 × 1000 mm among its pallet sizes (shared/TRADE.md). Two 1200 mm lengths side
    // by side take 2400 of 2450 mm, and 7300 / 1000 = 7 whole rows (the other way round: 6 rows).
    expect(deckGeometry({ deck_length_mm: 7300, deck_width_mm: 2450 })).toMatchObject({ rows: 7, row_depth_mm: 1000, across_mm: 1200 });
    // A deck too narrow to turn them keeps them lengthwise: 2 × 1000 in 2300 mm, 7300 / 1200 = 6 rows.
    expect(deckGeometry({ deck_length_mm: 7300, deck_width_mm: 2300 })).toMatchObject({ rows: 6, row_depth_mm: 1200, across_mm: 1000 });
  });

  it('turns the pallets on a 13.6 m trailer to take 26 of them (common practice: the usual full load of 1200 × 1000 pallets)', () => {
    const g = deckGeometry({ deck_length_mm: 13_600, deck_width_mm: 2450 });
    expect(g.rows * 2).toBe(26);
    expect(g.across_mm).toBe(1200);
  });
});

describe('deck plan', () => {
  it('puts the first ground drop at the rear and loads it last', () => {
    const plan = planDeck(rigid(), [drop(1, [800, 700]), drop(2, [900, 600])]);
    const d1 = plan.positions.filter((p) => p.drop === 1);
    const d2 = plan.positions.filter((p) => p.drop === 2);
    expect(Math.min(...d1.map((p) => p.row))).toBeGreaterThan(Math.max(...d2.map((p) => p.row)));
    const seq = plan.loading_sequence.map((i) => [plan.positions[i].drop, plan.positions[i].pallet]);
    expect(seq).toEqual([
      [2, 2],
      [2, 1],
      [1, 2],
      [1, 1],
    ]);
    // The load sits as one block in the middle: rows 3 and 4 of 7.
    expect(plan.positions.map((p) => p.row).sort()).toEqual([3, 3, 4, 4]);
    expect(plan.warnings).toEqual([]);
  });

  it('puts the first crane drop at the front, nearest the crane behind the cab', () => {
    const plan = planDeck(rigid({ has_crane: true, crane_max_kg: 1000 }), [drop(1, [800, 700], 'roof'), drop(2, [900, 600], 'roof')]);
    const d1 = plan.positions.filter((p) => p.drop === 1);
    const d2 = plan.positions.filter((p) => p.drop === 2);
    expect(Math.max(...d1.map((p) => p.row))).toBeLessThan(Math.min(...d2.map((p) => p.row)));
  });

  it('warns, naming the pallet, when a crane drop has a pallet heavier than the crane lifts', () => {
    const plan = planDeck(rigid({ has_crane: true, crane_max_kg: 1000 }), [drop(7, [950, 1050], 'roof')]);
    expect(plan.warnings).toContainEqual({ code: 'over_crane', message: expect.stringMatching(/^Pallet 2 of RL-000007 \(drop 1\) weighs 1,050 kg, more than the 1,000 kg/) });
  });

  it('warns when payload or pallet positions are exceeded, and still places every pallet once', () => {
    const plan = planDeck(rigid({ payload_kg: 3000, pallet_slots: 4 }), [drop(1, [900, 900, 900]), drop(2, [900, 900])]);
    expect(plan.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['over_payload', 'over_positions']));
    expect(plan.positions).toHaveLength(5);
  });

  it('balances left and right, and reports the centre of gravity in mm from the front', () => {
    const plan = planDeck(rigid(), [drop(1, [1000, 200, 600, 600])]);
    expect(plan.left_kg + plan.right_kg).toBe(2400);
    expect(Math.abs(plan.left_kg - plan.right_kg)).toBeLessThanOrEqual(1000);
    // Rows 3 and 4 of 1000 mm (seven rows, the two in use in the middle): centres at 2500 and 3500 mm.
    expect(plan.positions.map((p) => p.row).sort()).toEqual([3, 3, 4, 4]);
    const expected = plan.positions.reduce((s, p) => s + p.weight_kg * ((p.row - 1) * 1000 + 500), 0) / 2400;
    expect(plan.cog_from_front_mm).toBe(Math.round(expected));
  });

  it('warns when the centre of gravity is more than a quarter of the deck from the middle', () => {
    // One very heavy crane pallet at the front of a long load of light ones.
    const plan = planDeck(rigid({ has_crane: true, crane_max_kg: 5000, payload_kg: 20_000 }), [drop(1, [5000], 'roof'), drop(2, Array(11).fill(10))]);
    const cog = plan.cog_from_front_mm;
    expect(Math.abs(cog - 3650)).toBeGreaterThan(7300 / 4);
    expect(plan.warnings.map((w) => w.code)).toContain('cog_off_centre');
  });

  it('marks the pallets already loaded', () => {
    const plan = planDeck(rigid(), [drop(4, [500, 500])], new Set(['4:2']));
    expect(plan.positions.find((p) => p.pallet === 2)!.loaded).toBe(true);
    expect(plan.positions.find((p) => p.pallet === 1)!.loaded).toBe(false);
  });

  const dropsArb = fc.array(
    fc.record({
      weights: fc.array(fc.integer({ min: 20, max: 1400 }), { minLength: 1, maxLength: 8 }),
      roof: fc.boolean(),
    }),
    { minLength: 1, maxLength: 5 },
  );

  it('property: every pallet placed exactly once, no position twice, loading the reverse of unloading, sides within the heaviest pallet and equal to their sums', () => {
    fc.assert(
      fc.property(dropsArb, fc.boolean(), fc.integer({ min: 4, max: 26 }), (spec, crane, slots) => {
        const lorry = rigid({ has_crane: crane, crane_max_kg: crane ? 1200 : null, pallet_slots: slots, deck_length_mm: slots > 12 ? 13_600 : 7300, payload_kg: 26_000 });
        const drops = spec.map((d, i) => drop(100 + i, d.weights, d.roof ? 'roof' : 'ground'));
        const plan = planDeck(lorry, drops);
        const n = drops.reduce((s, d) => s + d.pallets.length, 0);

        // Every pallet exactly once.
        const keys = plan.positions.map((p) => `${p.order_id}:${p.pallet}`);
        expect(new Set(keys).size).toBe(n);
        expect(keys).toHaveLength(n);
        // No position twice.
        const places = plan.positions.map((p) => `${p.row}:${p.side}`);
        expect(new Set(places).size).toBe(n);
        // Loading sequence: a permutation, the exact reverse of the unloading order (drop, then pallet).
        expect([...plan.loading_sequence].sort((a, b) => a - b)).toEqual(plan.positions.map((_, i) => i));
        const unloading = [...plan.loading_sequence].reverse().map((i) => [plan.positions[i].drop, plan.positions[i].pallet]);
        const expected = drops.flatMap((d, i) => d.pallets.map((p) => [i + 1, p.n]));
        expect(unloading).toEqual(expected);
        // Sides.
        const sum = (side: string) => plan.positions.filter((p) => p.side === side).reduce((s, p) => s + p.weight_kg, 0);
        expect(plan.left_kg).toBeCloseTo(sum('left'), 1);
        expect(plan.right_kg).toBeCloseTo(sum('right'), 1);
        const heaviest = Math.max(...plan.positions.map((p) => p.weight_kg));
        expect(Math.abs(plan.left_kg - plan.right_kg)).toBeLessThanOrEqual(heaviest + 0.05);
        expect(plan.warnings.map((w) => w.code)).not.toContain('side_imbalance');
        // First off where it comes off first: ground pallets never in front of a later ground pallet,
        // crane pallets never behind a later crane pallet.
        const ordered = plan.positions.slice().sort((a, b) => a.drop - b.drop || a.pallet - b.pallet);
        const craneOf = (p: { drop: number }) => crane && drops[p.drop - 1].delivery_method === 'roof';
        const ground = ordered.filter((p) => !craneOf(p)).map((p) => p.row);
        const lifted = ordered.filter((p) => craneOf(p)).map((p) => p.row);
        ground.forEach((r, i) => i === 0 || expect(r).toBeLessThanOrEqual(ground[i - 1]));
        lifted.forEach((r, i) => i === 0 || expect(r).toBeGreaterThanOrEqual(lifted[i - 1]));
        // Over capacity always says so.
        if (n > slots) expect(plan.warnings.map((w) => w.code)).toContain('over_positions');
      }),
      { numRuns: 300 },
    );
  });
});
