import type { OrderLine, OrderLineStatus } from '../../../../shared/schemas/order.schema';
import type { Db } from '../../../db/knex';
import type { NewOrderLine, StoredOrderLine } from '../orders.repository';
import { lineProduct, toLine } from './order-row';

/** An order's lines: written with the order, changed by the desk's answers, read in position order. */
export function orderLinesRepository(db: Db) {
  async function insertLines(trx: Db, orderId: number, lines: NewOrderLine[], firstPosition: number): Promise<number[]> {
    const ids: number[] = [];
    for (const [i, l] of lines.entries()) {
      const [row] = await trx('order_lines')
        .insert({
          order_id: orderId,
          position: firstPosition + i,
          ...lineProduct(l),
          quantity: l.quantity,
          confirmed_quantity: l.confirmed_quantity ?? null,
          back_order_quantity: l.back_order_quantity ?? 0,
          reserved_quantity: 0,
          unit_price: l.unit_price,
          total: l.total,
          status: l.status,
          replaces_line_id: l.replaces_line_id ?? null,
        })
        .returning('id');
      ids.push((row as { id: number }).id);
    }
    return ids;
  }

  return {
    insertLines,

    async replaceLines(trx: Db, orderId: number, lines: NewOrderLine[]): Promise<void> {
      await trx('order_lines').where({ order_id: orderId }).delete();
      await insertLines(trx, orderId, lines, 1);
    },

    async updateLine(trx: Db, lineId: number, values: Partial<Pick<OrderLine, 'quantity' | 'confirmed_quantity' | 'back_order_quantity' | 'total' | 'status'>>): Promise<void> {
      await trx('order_lines').where({ id: lineId }).update(values);
    },

    /** A line after the desk's confirmation: what it sends now, what follows, what is held from stock. */
    async setConfirmed(trx: Db, lineId: number, v: { confirmed_quantity: number; back_order_quantity: number; reserved_quantity: number; total: number; status: OrderLineStatus }): Promise<void> {
      await trx('order_lines').where({ id: lineId }).update(v);
    },

    async setDelivered(trx: Db, lineId: number, delivered: number): Promise<void> {
      await trx('order_lines').where({ id: lineId }).update({ delivered_quantity: delivered, reserved_quantity: 0 });
    },

    async lines(orderId: number, trx: Db = db): Promise<StoredOrderLine[]> {
      const rows = await trx('order_lines').where({ order_id: orderId }).orderBy('position');
      return rows.map(toLine);
    },
  };
}
