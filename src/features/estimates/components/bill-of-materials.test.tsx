import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { EstimateLine } from '../../../../shared/schemas/estimate.schema';
import { groupBillLines } from '../lib/bill';
import { formatMoney } from '../../../lib/format';
import { BillOfMaterials } from './bill-of-materials';

let nextId = 1;
function line(category: EstimateLine['category'], description: string, quantity: number, packSize: number, unitPrice: number | null, position: number, figure: EstimateLine['figure'] = 'tiles_order'): EstimateLine {
  const packs = Math.ceil(quantity / packSize);
  return {
    id: nextId++,
    position,
    category,
    product_id: unitPrice === null ? null : nextId,
    sku: unitPrice === null ? null : `SKU-${nextId}`,
    description,
    quantity,
    unit: category === 'tile' ? 'tile' : category === 'batten_nail' ? 'nail' : category === 'underlay' ? 'roll' : 'piece',
    pack_size: packSize,
    packs,
    unit_price: unitPrice,
    total: unitPrice === null ? null : packs * unitPrice,
    figure,
  };
}

// Given out of order on purpose: the bill lists categories in its own order whatever the server sends.
const lines: EstimateLine[] = [
  line('underlay', 'Breathable underlay 1 m × 50 m', 53, 1, 6400, 7, 'underlay_rolls'),
  line('batten_nail', 'Batten nails 65 × 3.35, box of 1000', 12136, 1000, 1850, 5, 'batten_nails'),
  line('tile', 'Interlocking tile, slate grey', 22176, 1, 128, 1),
  line('accessory', 'Dry verge unit, left', 40, 1, 395, 9),
  line('ridge', 'Half-round ridge', 248, 1, 650, 2, 'ridge_tiles'),
  line('accessory', 'Dry verge unit, right', 40, 1, 395, 8),
];

describe('bill of materials', () => {
  it('groups the lines under their categories in bill order, keeping each group’s own order', () => {
    const groups = groupBillLines(lines);
    expect(groups.map((g) => g.label)).toEqual(['Tiles', 'Ridge', 'Batten nails', 'Underlay', 'Accessories']);
    expect(groups[4].lines.map((l) => l.description)).toEqual(['Dry verge unit, right', 'Dry verge unit, left']);
    expect(groups[4].subtotal).toBe(2 * 40 * 395);
  });

  it('formats pence as pounds and pence, with thousands separated', () => {
    expect(formatMoney(2838528)).toBe('£28,385.28');
    expect(formatMoney(5)).toBe('£0.05');
    expect(formatMoney(0)).toBe('£0.00');
    expect(formatMoney(null)).toBe('—');
  });

  it('shows each line’s need, its whole packs and prices, and the subtotal', () => {
    const subtotal = lines.reduce((sum, l) => sum + (l.total ?? 0), 0);
    render(<BillOfMaterials lines={lines} notCounted={[]} subtotal={subtotal} />);
    const rows = within(screen.getByRole('table', { name: 'Bill of materials' }))
      .getAllByRole('row')
      .slice(1);
    expect(rows.map((row) => within(row).getAllByRole('cell')[0].textContent)).toEqual(['Tiles', 'Ridge', 'Batten nails', 'Underlay', 'Accessories', 'Accessories']);
    const nails = within(rows[2])
      .getAllByRole('cell')
      .map((cell) => cell.textContent);
    // 12,136 nails in boxes of 1,000 round up to 13 boxes.
    expect(nails.slice(2)).toEqual(['12,136 nails', '13 × 1,000', '£18.50', '£240.50']);
    expect(within(rows[0]).getAllByRole('cell')[5].textContent).toBe('£28,385.28');
    expect(screen.getByTestId('bill-subtotal').textContent).toBe(formatMoney(subtotal));
    // A category of two lines gets its own total.
    const byCategory = within(screen.getByLabelText('Totals by category'));
    expect(byCategory.getByText('Accessories').nextElementSibling?.textContent).toBe('£316.00');
  });

  it('says there are no prices for a generic system instead of showing £0', () => {
    const generic = [line('tile', 'Tile, generic', 1000, 1, null, 1)];
    render(<BillOfMaterials lines={generic} notCounted={[]} subtotal={null} />);
    const cells = within(screen.getAllByRole('row')[1])
      .getAllByRole('cell')
      .map((cell) => cell.textContent);
    expect(cells.slice(4)).toEqual(['—', '—']);
    expect(screen.getByTestId('bill-subtotal').textContent).toBe('No prices (generic system)');
  });
});
