import type { OrderAmounts, OrderStatus } from '../schemas/order.schema';

export interface LineForAmounts {
  quantity: number;
  confirmed_quantity: number | null;
  back_order_quantity: number;
  delivered_quantity: number | null;
  unit_price: number;
}

export interface LineAmounts {
  now_quantity: number;
  now_total: number;
  to_follow_total: number;
  dropped_quantity: number;
  dropped_total: number;
}

/** Stages in which nothing more will be sent on the order. */
const ENDED: readonly OrderStatus[] = ['cancelled', 'turned_down'];

/**
 * A line split into packs on this order's delivery, packs to follow and packs dropped, each priced at
 * the line's pack price (minor units). On the delivery: the packs handed over once the delivery is
 * recorded, the packs agreed once the desk has answered, the packs asked for before that — the same
 * quantities the invoice charges. The three parts always add up to the packs asked for plus any
 * packs the desk back-ordered.
 */
export function lineAmounts(line: LineForAmounts, status: OrderStatus): LineAmounts {
  const price = line.unit_price;
  if (ENDED.includes(status)) {
    return { now_quantity: 0, now_total: 0, to_follow_total: 0, dropped_quantity: line.quantity, dropped_total: line.quantity * price };
  }
  const agreed = line.confirmed_quantity ?? line.quantity;
  const now = line.delivered_quantity ?? agreed;
  const notAgreed = Math.max(0, line.quantity - agreed - line.back_order_quantity);
  const shortOnDelivery = Math.max(0, agreed - now);
  const dropped = notAgreed + shortOnDelivery;
  return { now_quantity: now, now_total: now * price, to_follow_total: line.back_order_quantity * price, dropped_quantity: dropped, dropped_total: dropped * price };
}

/** The order's three amounts: the sum of its lines' parts. */
export function orderAmounts(lines: readonly LineAmounts[]): OrderAmounts {
  return {
    agreed_now_minor: lines.reduce((s, l) => s + l.now_total, 0),
    to_follow_minor: lines.reduce((s, l) => s + l.to_follow_total, 0),
    dropped_minor: lines.reduce((s, l) => s + l.dropped_total, 0),
  };
}
