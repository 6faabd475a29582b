import { describe, expect, it } from 'vitest';
import { orderLoad, type LoadLine } from './order-load';

const line = (category: string, packs: number, packWeightKg: number, packSize = 1) => ({
  category: category as LoadLine['category'],
  packs,
  pack_size: packSize,
  pack_weight_kg: packWeightKg,
});

describe('an order’s lorry load', () => {
  it('carries double-lap special tiles on the tile pallets after the full tiles, and fittings with the accessories', () => {
    const load = orderLoad([line('tile', 900, 1.1), line('eaves_tile', 42, 1.1), line('tile_and_half', 32, 1.65), line('dry_verge', 60, 0.35), line('ridge_end_cap', 2, 0.4)], null);
    const tilePallets = load.plan.pallets.filter((p) => p.kind === 'tiles');
    // 900 + 42 + 32 pieces at 180 a pallet (the default system's pallet): 6 pallets, the specials at the end.
    expect(tilePallets).toHaveLength(Math.ceil((900 + 42 + 32) / 180));
    expect(tilePallets.flatMap((p) => p.items.map((i) => [i.item, i.quantity]))).toEqual([
      ['eaves_tiles', 42],
      ['tile_and_half', 32],
    ]);
    const accessories = load.plan.pallets.filter((p) => p.kind === 'accessories').flatMap((p) => p.items.map((i) => i.item));
    expect(accessories).toEqual(['dry_verge_units', 'ridge_end_caps']);
    // Every piece is weighed once: tiles, specials, fittings and the pallets themselves (25 kg each).
    expect(load.weight_kg).toBeCloseTo(900 * 1.1 + 42 * 1.1 + 32 * 1.65 + 60 * 0.35 + 2 * 0.4 + load.pallets * 25, 1);
  });

  it('carries products sold by the metre with the accessories, in metres, weighed by their packs', () => {
    // 4 rolls of 5 m eaves vent at 1.4 kg, 12 lengths of 2 m undercloak at 2.6 kg, one 6 m flashing roll at 4.8 kg.
    const load = orderLoad([line('tile', 180, 4.4), line('eaves_vent', 4, 1.4, 5), line('verge_undercloak', 12, 2.6, 2), line('flashing', 1, 4.8, 6)], null);
    const items = load.plan.pallets.filter((p) => p.kind === 'accessories').flatMap((p) => p.items.map((i) => [i.item, i.quantity]));
    expect(items).toEqual([
      ['eaves_vent', 20],
      ['verge_undercloak', 24],
      ['flashing', 6],
    ]);
    expect(load.weight_kg).toBeCloseTo(180 * 4.4 + 4 * 1.4 + 12 * 2.6 + 4.8 + load.pallets * 25, 1);
  });
});
