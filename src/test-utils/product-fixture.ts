import type { Product } from '../../shared/schemas/price-list.schema';

/** The figures typed for an invented concrete interlocking tile sold singly (4.4 kg a tile: from memory, typical of its kind). */
export const TILE_VALUES = {
  sku: 'TRS-FL420-BR',
  name: 'Stanmoor flat interlocking tile, brindle',
  category: 'tile',
  unit: 'tile',
  pack_size: 1,
  pack_weight_kg: 4.4,
  tax_rate_bp: 2000,
  pallet_length_mm: 1200,
  pallet_width_mm: 1000,
} as const;

/** An invented catalogue product as the server answers with it: the tile above, at no branch yet. */
export function productFixture(overrides: Partial<Product> = {}): Product {
  return {
    id: 21,
    ...TILE_VALUES,
    technical: {},
    branches: [],
    archived_at: null,
    created_at: '2026-12-01T09:00:00.000Z',
    updated_at: '2026-12-01T09:00:00.000Z',
    ...overrides,
  };
}
