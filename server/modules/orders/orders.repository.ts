import type { OrderLine, OrderLineStatus, OrderSite, OrderStatus } from '../../../shared/schemas/order.schema';
import type { Db } from '../../db/knex';
import { orderBookRepository } from './repository/order-book-queries';
import { orderLinesRepository } from './repository/order-lines';
import { orderProposalsRepository } from './repository/order-proposals';
import { orderReadsRepository } from './repository/order-reads';
import { orderWritesRepository } from './repository/order-writes';

/** Whose view: a contractor sees the orders it placed, a merchant the orders sent to its branches. */
export interface OrderParty {
  kind: 'contractor' | 'merchant';
  organisationId: number;
}

export interface OrderRow {
  id: number;
  contractor_organisation_id: number;
  contractor_name: string;
  merchant_organisation_id: number;
  merchant_name: string;
  branch_id: number;
  branch_name: string;
  branch_town: string;
  project_id: number;
  estimate_id: number | null;
  quote_id: number | null;
  /** The order whose back-ordered packs this one carries. */
  follows_order_id: number | null;
  status: OrderStatus;
  revision: number;
  requested_date: string;
  time_window: string | null;
  delivery_method: 'ground' | 'roof';
  po_reference: string;
  notes: string;
  site_name: string;
  site: OrderSite;
  subtotal: number;
  line_count: number;
  placed_by: number | null;
  placed_at: string;
  confirmed_at: string | null;
  cancelled_at: string | null;
  updated_at: string;
}

export interface NewOrderLine {
  product_id: number;
  sku: string;
  description: string;
  category: string;
  unit: string;
  pack_size: number;
  pack_weight_kg: number;
  quantity: number;
  confirmed_quantity?: number | null;
  back_order_quantity?: number;
  unit_price: number;
  total: number;
  status: OrderLineStatus;
  replaces_line_id?: number | null;
}

export interface NewEvent {
  kind: string;
  actor: { userId: number | null; name: string; organisationId: number | null };
  summary: string;
  data?: Record<string, unknown>;
}

export type StoredOrderLine = OrderLine & { delivered_quantity: number | null };

/**
 * The orders module's only access to the database, cut by what it does: reads of one order, writes,
 * lines, the desk's proposals, and the order book's queries (each in repository/). Every query is
 * scoped to the caller's side; another firm's order is "not found".
 */
export function ordersRepository(db: Db) {
  return {
    ...orderReadsRepository(db),
    ...orderWritesRepository(db),
    ...orderLinesRepository(db),
    ...orderProposalsRepository(db),
    ...orderBookRepository(db),
  };
}

export type OrdersRepository = ReturnType<typeof ordersRepository>;
