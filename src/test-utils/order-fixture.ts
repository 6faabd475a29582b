import type { OrderDetail, OrderSite } from '../../shared/schemas/order.schema';
import type { StockItem } from '../../shared/schemas/stock.schema';
import { lineAmounts, orderAmounts } from '../../shared/domain/order-amounts';

/** An invented order line for component tests: packs of 240 tiles at £307.20 a pack, nothing answered yet. */
export const fixtureLine = (id: number, product_id: number, sku: string, description: string, quantity: number): OrderDetail['lines'][number] => ({
  id,
  position: id - 100,
  product_id,
  sku,
  description,
  category: 'tile',
  unit: 'pack',
  pack_size: 240,
  pack_weight_kg: 1100,
  quantity,
  confirmed_quantity: null,
  back_order_quantity: 0,
  reserved_quantity: 0,
  unit_price: 30_720,
  total: 30_720 * quantity,
  status: 'asked',
  replaces_line_id: null,
  delivered_quantity: null,
  ...lineAmounts({ quantity, confirmed_quantity: null, back_order_quantity: 0, delivered_quantity: null, unit_price: 30_720 }, 'sent'),
});

/** The invented site the order and quote fixtures go to. */
export const fixtureSite: OrderSite = {
  name: 'Hollin Brow, plots 1–20',
  site_address: 'Hollin Brow, Tollerbeck',
  site_postcode: '',
  contact_name: 'Gethin Marlow',
  contact_phone: '07700 900 001',
  vehicle_access: 'rigid_only',
  crane_lift: 'allowed',
  overhead_lines: 'none',
  set_down_place: 'Hardstanding by the cabin',
  access_notes: '',
};

/** An invented order for component tests: two lines at Tollerbeck Yard, waiting for the desk. */
export function orderFixture(overrides: Partial<OrderDetail> = {}): OrderDetail {
  const line = fixtureLine;
  const order: Omit<OrderDetail, 'amounts'> = {
    id: 1,
    reference: 'RL-000001',
    status: 'sent',
    status_label: 'Sent to the merchant',
    revision: 1,
    contractor: { id: 5, name: 'Brackenfold Roofworks' },
    branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck', merchant: { id: 2, name: 'Tollerbeck Roofing Supplies' } },
    project: { id: 9, name: 'Hollin Brow, plots 1–20' },
    requested_date: '2027-03-01',
    time_window: null,
    delivery_method: 'ground',
    po_reference: 'HB-1',
    subtotal: 30_720 * 15,
    line_count: 2,
    placed_at: '2027-02-20 09:00:00',
    updated_at: '2027-02-20 09:00:00',
    estimate_id: 4,
    quote_id: null,
    notes: '',
    site: fixtureSite,
    lines: [line(101, 11, 'TRS-FL420-SG', 'Interlocking tile, slate grey', 10), line(102, 12, 'TRS-RHR-SG', 'Half-round ridge', 5)],
    proposals: [],
    timeline: [],
    allowed_actions: ['confirm', 'offer_changes', 'turn_down'],
    cautions: [],
    confirmed_at: null,
    cancelled_at: null,
    slot: null,
    delivery: null,
    comments: [],
    invoice: null,
    follows: null,
    followed_by: null,
    back_ordered_packs: 0,
    ...overrides,
  };
  // Lines given by a test are priced again for the order's stage, so the three amounts always agree with them.
  const lines = order.lines.map((l) => ({ ...l, ...lineAmounts(l, order.status) }));
  return { ...order, lines, amounts: overrides.amounts ?? orderAmounts(lines) };
}

export function stockFixture(product_id: number, sku: string, available: number): StockItem {
  return {
    product_id,
    sku,
    name: sku,
    category: 'tile',
    unit: 'pack',
    pack_size: 240,
    pack_price: 30_720,
    on_hand: available + 2,
    reserved: 2,
    available,
    reorder_level: 4,
    state: 'in_stock',
    updated_at: '2027-02-20 09:00:00',
  };
}
