import type { OrderLine, OrderLineStatus, OrderSite } from '../../../../shared/schemas/order.schema';
import type { Db } from '../../../db/knex';
import type { NewOrderLine, OrderParty, OrderRow, StoredOrderLine } from '../orders.repository';

/** The product a line is for, as the line keeps it: a copy, so a later change to the catalogue leaves the order as sent. */
export type LineProduct = Pick<NewOrderLine, 'product_id' | 'sku' | 'description' | 'category' | 'unit' | 'pack_size' | 'pack_weight_kg'>;

/** The product fields of a line, copied from another line (a follow-up's, or the row written for one). */
export function lineProduct(l: LineProduct): LineProduct {
  return { product_id: l.product_id, sku: l.sku, description: l.description, category: l.category, unit: l.unit, pack_size: l.pack_size, pack_weight_kg: l.pack_weight_kg };
}

/** The columns of an order row with its firms' and branch's names (the joins of `scoped`). */
export const ORDER_COLUMNS = [
  'o.id',
  'o.contractor_organisation_id',
  'co.name as contractor_name',
  'o.merchant_organisation_id',
  'mo.name as merchant_name',
  'o.branch_id',
  'b.name as branch_name',
  'b.town as branch_town',
  'o.project_id',
  'o.estimate_id',
  'o.quote_id',
  'o.follows_order_id',
  'o.status',
  'o.revision',
  'o.requested_date',
  'o.time_window',
  'o.delivery_method',
  'o.po_reference',
  'o.notes',
  'o.site_name',
  'o.site',
  'o.subtotal',
  'o.placed_by',
  'o.placed_at',
  'o.confirmed_at',
  'o.cancelled_at',
  'o.updated_at',
];

export function toOrder(r: Record<string, unknown>): OrderRow {
  return { ...(r as unknown as OrderRow), site: JSON.parse(r.site as string) as OrderSite, line_count: Number(r.line_count ?? 0) };
}

export function toLine(r: Record<string, unknown>): StoredOrderLine {
  return {
    id: r.id as number,
    position: r.position as number,
    product_id: r.product_id as number,
    sku: r.sku as string,
    description: r.description as string,
    category: r.category as OrderLine['category'],
    unit: r.unit as string,
    pack_size: r.pack_size as number,
    pack_weight_kg: Number(r.pack_weight_kg),
    quantity: r.quantity as number,
    confirmed_quantity: (r.confirmed_quantity as number | null) ?? null,
    back_order_quantity: r.back_order_quantity as number,
    reserved_quantity: r.reserved_quantity as number,
    unit_price: r.unit_price as number,
    total: r.total as number,
    status: r.status as OrderLineStatus,
    replaces_line_id: (r.replaces_line_id as number | null) ?? null,
    delivered_quantity: (r.delivered_quantity as number | null) ?? null,
  };
}

/** Orders joined to their firms and branch, limited to the caller's side: another firm's order is not there. */
export function scoped(trx: Db, party: OrderParty) {
  const q = trx('orders as o').join('organisations as co', 'co.id', 'o.contractor_organisation_id').join('organisations as mo', 'mo.id', 'o.merchant_organisation_id').join('branches as b', 'b.id', 'o.branch_id');
  if (party.kind === 'contractor') q.where('o.contractor_organisation_id', party.organisationId);
  else q.where('o.merchant_organisation_id', party.organisationId);
  return q;
}

/** The number of lines of the order in the outer query, as a sub-select. */
export const lineCount = (trx: Db) => trx('order_lines as ol').count('*').whereRaw('?? = ??', ['ol.order_id', 'o.id']).as('line_count');
