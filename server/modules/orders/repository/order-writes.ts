import type { OrderStatus } from '../../../../shared/schemas/order.schema';
import type { Db } from '../../../db/knex';
import { nowIso } from '../../../db/time';
import type { NewEvent, NewOrderLine, OrderRow } from '../orders.repository';
import { orderLinesRepository } from './order-lines';

/** Writes to an order: a new order with its lines, guarded stage changes, its timeline and comments. */
export function orderWritesRepository(db: Db) {
  const lines = orderLinesRepository(db);
  return {
    async insertOrder(
      trx: Db,
      o: Omit<OrderRow, 'id' | 'contractor_name' | 'merchant_name' | 'branch_name' | 'branch_town' | 'line_count' | 'revision' | 'confirmed_at' | 'cancelled_at' | 'updated_at' | 'follows_order_id'> & {
        follows_order_id?: number | null;
      },
      orderLines: NewOrderLine[],
    ): Promise<number> {
      const [row] = await trx('orders')
        .insert({
          contractor_organisation_id: o.contractor_organisation_id,
          merchant_organisation_id: o.merchant_organisation_id,
          branch_id: o.branch_id,
          project_id: o.project_id,
          estimate_id: o.estimate_id,
          quote_id: o.quote_id,
          follows_order_id: o.follows_order_id ?? null,
          status: o.status,
          revision: 1,
          requested_date: o.requested_date,
          time_window: o.time_window,
          delivery_method: o.delivery_method,
          po_reference: o.po_reference,
          notes: o.notes,
          site_name: o.site_name,
          site: JSON.stringify(o.site),
          subtotal: o.subtotal,
          placed_by: o.placed_by,
          placed_at: o.placed_at,
          updated_at: o.placed_at,
        })
        .returning('id');
      const id = (row as { id: number }).id;
      await lines.insertLines(trx, id, orderLines, 1);
      return id;
    },

    /**
     * Changes an order only if it is still in one of the given stages (and, when given, at the given
     * revision), so two people acting at once cannot both win. Returns whether it changed.
     */
    async updateIf(trx: Db, id: number, guard: { statuses: readonly OrderStatus[]; revision?: number }, values: Record<string, unknown>, bumpRevision: boolean): Promise<boolean> {
      const q = trx('orders')
        .where('id', id)
        .whereIn('status', guard.statuses as OrderStatus[]);
      if (guard.revision !== undefined) q.where('revision', guard.revision);
      const n = await q.update({
        ...values,
        ...(bumpRevision ? { revision: trx.raw('?? + 1', ['revision']) } : {}),
        updated_at: nowIso(),
      });
      return n > 0;
    },

    async insertComment(trx: Db, orderId: number, c: { userId: number; name: string; organisationId: number; body: string }): Promise<number> {
      const [row] = await trx('order_comments').insert({ order_id: orderId, author_user_id: c.userId, author_name: c.name, author_organisation_id: c.organisationId, body: c.body, created_at: nowIso() }).returning('id');
      return (row as { id: number }).id;
    },

    async insertEvent(trx: Db, orderId: number, e: NewEvent): Promise<void> {
      await trx('order_events').insert({
        order_id: orderId,
        kind: e.kind,
        actor_user_id: e.actor.userId,
        actor_name: e.actor.name,
        actor_organisation_id: e.actor.organisationId,
        summary: e.summary,
        data: JSON.stringify(e.data ?? {}),
        created_at: nowIso(),
      });
    },
  };
}
