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
});
