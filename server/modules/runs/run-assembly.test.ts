import { describe, expect, it } from 'vitest';
import { palletItems } from './run-assembly';

/** An order's product names by category, as its lines give them. */
const names = new Map([
  ['tile', { description: 'Clay plain tile 265 × 165, brindle', unit: 'tile' }],
  ['eaves_tile', { description: 'Clay plain eaves tile 190 × 165, brindle', unit: 'tile' }],
  ['tile_and_half', { description: 'Clay plain tile-and-a-half 265 × 248, brindle', unit: 'tile' }],
  ['hip_iron', { description: 'Galvanised hip iron', unit: 'piece' }],
  ['dry_verge', { description: 'Dry verge unit, russet', unit: 'piece' }],
  ['flashing', { description: 'Flashing roll 300 mm × 6 m', unit: 'm' }],
]);

describe('what a pallet carries, in the order’s own words', () => {
  it('lists a tile pallet’s special pieces after its tiles, by their product names', () => {
    const items = palletItems(
      {
        kind: 'tiles',
        tiles: 700,
        items: [
          { item: 'eaves_tiles', quantity: 60 },
          { item: 'tile_and_half', quantity: 40 },
        ],
      },
      names,
    );
    expect(items).toEqual([
      { description: 'Clay plain tile 265 × 165, brindle', quantity: 700, unit: 'tiles' },
      { description: 'Clay plain eaves tile 190 × 165, brindle', quantity: 60, unit: 'tiles' },
      { description: 'Clay plain tile-and-a-half 265 × 248, brindle', quantity: 40, unit: 'tiles' },
    ]);
  });

  it('names fittings by the product they were ordered as, and products sold by the metre in metres', () => {
    const items = palletItems(
      {
        kind: 'accessories',
        tiles: 0,
        items: [
          { item: 'hip_irons', quantity: 4 },
          { item: 'dry_verge_units', quantity: 60 },
          { item: 'flashing', quantity: 12 },
        ],
      },
      names,
    );
    expect(items).toEqual([
      { description: 'Galvanised hip iron', quantity: 4, unit: 'pieces' },
      { description: 'Dry verge unit, russet', quantity: 60, unit: 'pieces' },
      { description: 'Flashing roll 300 mm × 6 m', quantity: 12, unit: 'm' },
    ]);
  });
});
