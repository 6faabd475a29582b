import { describe, expect, it } from 'vitest';
import { roofSystemSchema, type RoofSystemInput } from '../schemas/roof-system.schema';
import { planDelivery, type DeliveryInput } from './delivery';

const system = (input: RoofSystemInput = {}) => roofSystemSchema.parse(input);

const input = (over: Partial<DeliveryInput> = {}): DeliveryInput => ({
  tilesOrdered: 500,
  faces: [
    { building: 'A', face: 'Front', tiles: 150, quantity: 2 },
    { building: 'A', face: 'Back', tiles: 170, quantity: 1 },
  ],
  firstOff: [
    { item: 'underlay_rolls', quantity: 3, unit_kg: 6 },
    { item: 'battens', quantity: 40, unit_kg: 2.16 },
  ],
  lastOff: [{ item: 'ridge_tiles', quantity: 25, unit_kg: 5 }],
  ...over,
});

describe('delivery', () => {
  it('puts the tiles on pallets of per_pallet, the last one part-full, each with its weight and the faces it serves', () => {
    const plan = planDelivery(input(), system(), 1_000);
    const tiles = plan.pallets.filter((p) => p.kind === 'tiles');
    expect(plan.tile_pallets).toBe(3);
    expect(tiles.map((p) => p.tiles)).toEqual([180, 180, 140]);
    expect(tiles[0].weight_kg).toBeCloseTo(180 * 4.4 + 25, 6);
    expect(tiles[0].faces).toEqual([{ building: 'A', face: 'Front', tiles: 180 }]);
    expect(tiles[1].faces).toEqual([
      { building: 'A', face: 'Front', tiles: 120 },
      { building: 'A', face: 'Back', tiles: 60 },
    ]);
    expect(tiles[2].faces).toEqual([
      { building: 'A', face: 'Back', tiles: 110 },
      { building: '', face: 'spare', tiles: 30 },
    ]);
  });

  it('sends underlay and battens off first and ridge tiles last, and numbers pallets in the order they come off (common practice)', () => {
    const plan = planDelivery(input(), system(), 1_000);
    expect(plan.pallets.map((p) => p.n)).toEqual([1, 2, 3, 4, 5]);
    expect(plan.pallets.map((p) => p.kind)).toEqual(['accessories', 'tiles', 'tiles', 'tiles', 'accessories']);
    expect(plan.pallets[0].items.map((i) => i.item)).toEqual(['underlay_rolls', 'battens']);
    expect(plan.pallets[4].items).toEqual([{ item: 'ridge_tiles', quantity: 25, weight_kg: 125 }]);
  });

  it('loads what comes off first last (common practice)', () => {
    const plan = planDelivery(input(), system(), 1_000);
    expect(plan.loads).toHaveLength(1);
    expect(plan.loads[0].pallets).toEqual([5, 4, 3, 2, 1]);
    const sum = plan.pallets.reduce((s, p) => s + p.weight_kg, 0);
    expect(plan.loads[0].weight_kg).toBeCloseTo(sum, 1);
    expect(plan.weight_kg).toBeCloseTo(sum, 0);
  });

  it('splits the pallets into lorry loads by pallet slots and by payload', () => {
    const bySlots = planDelivery(input({ tilesOrdered: 3_000 }), system({ truck: { pallet_slots: 6 } }), 1_000);
    expect(bySlots.loads.map((l) => l.pallets.length)).toEqual([6, 6, 6, 1]); // 17 tile pallets and two accessory pallets
    expect(bySlots.loads[0].pallets).toEqual([6, 5, 4, 3, 2, 1]);
    expect(bySlots.loads[1].pallets).toEqual([12, 11, 10, 9, 8, 7]);
    const byWeight = planDelivery(input({ tilesOrdered: 3_000 }), system({ truck: { payload_kg: 2_000 } }), 1_000);
    for (const load of byWeight.loads) expect(load.weight_kg).toBeLessThanOrEqual(2_000);
    expect(byWeight.loads.flatMap((l) => l.pallets).sort((a, b) => a - b)).toEqual(byWeight.pallets.map((p) => p.n));
  });

  it('makes up accessory pallets to the heaviest pallet the crane handles', () => {
    const plan = planDelivery(input({ firstOff: [{ item: 'battens', quantity: 1_000, unit_kg: 2.16 }] }), system(), 1_000);
    const acc = plan.pallets.filter((p) => p.kind === 'accessories' && p.items[0].item === 'battens');
    expect(acc.map((p) => p.items[0].quantity)).toEqual([451, 451, 98]); // 975 kg net a pallet
    for (const p of acc) expect(p.weight_kg).toBeLessThanOrEqual(1_000);
    expect(plan.accessory_pallets).toBe(4);
  });

  it('flags a pallet heavier than the lorry can carry, and a plan too big to list', () => {
    const heavy = planDelivery(input(), system({ truck: { payload_kg: 500 } }), 1_000);
    expect(heavy.issues.map((i) => i.code)).toContain('pallet_over_payload');
    const big = planDelivery(input({ tilesOrdered: 1_000_000 }), system(), 1_000);
    expect(big.issues.map((i) => i.code)).toContain('delivery_plan_too_large');
    expect(big.pallets).toEqual([]);
    expect(big.tile_pallets).toBe(Math.ceil(1_000_000 / 180));
    expect(big.weight_kg).toBeGreaterThan(4_400_000);
  });
});
