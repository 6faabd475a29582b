import type { QuoteRequest } from '../../shared/schemas/order.schema';
import type { StockItem } from '../../shared/schemas/stock.schema';
import { fixtureSite } from './order-fixture';

/** An invented quote request for component tests: two lines asked of Tollerbeck Yard, not yet priced. */
export function quoteRequestFixture(overrides: Partial<QuoteRequest> = {}): QuoteRequest {
  return {
    id: 7,
    status: 'open',
    contractor: { id: 5, name: 'Brackenfold Roofworks' },
    project: { id: 9, name: 'Hollin Brow, plots 1–20' },
    site: fixtureSite,
    estimate_id: 4,
    requested_date: '2027-03-01',
    time_window: null,
    delivery_method: 'ground',
    po_reference: 'HB-1',
    notes: '',
    lines: [
      { id: 201, position: 1, category: 'tile', description: 'Interlocking tile', quantity: 2300, unit: 'tiles' },
      { id: 202, position: 2, category: 'ridge', description: 'Half-round ridge', quantity: 24, unit: 'pieces' },
    ],
    quotes: [
      {
        id: 31,
        status: 'asked',
        status_label: 'Waiting for a price',
        branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck', merchant: { id: 2, name: 'Tollerbeck Roofing Supplies' } },
        message: '',
        valid_until: null,
        total: null,
        answered_at: null,
        order_id: null,
        lines: [],
      },
    ],
    comparison: null,
    cautions: [],
    created_at: '2027-02-20 09:00:00',
    updated_at: '2027-02-20 09:00:00',
    ...overrides,
  };
}

export function quoteStockFixture(product_id: number, sku: string, category: StockItem['category'], pack_price: number): StockItem {
  return { product_id, sku, name: sku, category, unit: 'pack', pack_size: 240, pack_price, on_hand: 40, reserved: 0, available: 40, reorder_level: 4, state: 'in_stock', updated_at: '2027-02-20 09:00:00' };
}
