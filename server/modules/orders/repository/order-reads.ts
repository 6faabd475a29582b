import type { OrderComment, OrderEvent, OrderStatus } from '../../../../shared/schemas/order.schema';
import { invoiceNumber } from '../../../../shared/schemas/invoice.schema';
import type { Db } from '../../../db/knex';
import type { OrderParty, OrderRow } from '../orders.repository';
import { ORDER_COLUMNS, lineCount, scoped, toOrder } from './order-row';

/** Reads of one order: the order itself, its timeline, comments, invoice, follow-up and whom to tell. */
export function orderReadsRepository(db: Db) {
  return {
    async find(party: OrderParty, id: number, trx: Db = db): Promise<OrderRow | undefined> {
      const row = await scoped(trx, party)
        .where('o.id', id)
        .select([...ORDER_COLUMNS, lineCount(trx)])
        .first();
      return row ? toOrder(row) : undefined;
    },

    async comments(orderId: number, trx: Db = db): Promise<(OrderComment & { organisationKind: string })[]> {
      const rows = await trx('order_comments as c')
        .join('organisations as o', 'o.id', 'c.author_organisation_id')
        .where('c.order_id', orderId)
        .select('c.id', 'c.body', 'c.created_at', 'c.author_user_id', 'c.author_name', 'o.id as org_id', 'o.name as org_name', 'o.kind as org_kind')
        .orderBy('c.id');
      return rows.map((r) => ({
        id: r.id,
        body: r.body,
        at: r.created_at,
        author: { id: r.author_user_id, name: r.author_name, organisation: { id: r.org_id, name: r.org_name } },
        side: r.org_kind === 'merchant' ? 'merchant' : 'contractor',
        organisationKind: r.org_kind,
      }));
    },

    async invoiceOf(orderId: number, trx: Db = db): Promise<{ id: number; number: string } | null> {
      const row = await trx('invoices').where({ order_id: orderId }).first('id', 'number');
      return row ? { id: row.id, number: invoiceNumber(row.number) } : null;
    },

    async events(orderId: number, trx: Db = db): Promise<OrderEvent[]> {
      const rows = await trx('order_events as e')
        .leftJoin('organisations as o', 'o.id', 'e.actor_organisation_id')
        .where('e.order_id', orderId)
        .select('e.id', 'e.kind', 'e.created_at', 'e.actor_name', 'e.actor_organisation_id', 'o.name as organisation_name', 'e.summary', 'e.data')
        .orderBy('e.id');
      return rows.map((r) => ({
        id: r.id,
        kind: r.kind,
        at: r.created_at,
        actor: { name: r.actor_name, organisation: r.actor_organisation_id ? { id: r.actor_organisation_id, name: r.organisation_name } : null },
        summary: r.summary,
        data: JSON.parse(r.data) as Record<string, unknown>,
      }));
    },

    /** The live order that carries this one's back-ordered packs, if one has been started (not one cancelled or turned down since). */
    async followUpOf(orderId: number, trx: Db = db): Promise<{ id: number; status: OrderStatus } | undefined> {
      return trx('orders').where({ follows_order_id: orderId }).whereNotIn('status', ['cancelled', 'turned_down']).first('id', 'status');
    },

    /** The people who run a merchant's order desk: they hear of every new order and change. */
    async deskEmails(merchantOrganisationId: number, trx: Db = db): Promise<string[]> {
      return trx('users').where({ organisation_id: merchantOrganisationId }).whereIn('role', ['merchant_owner', 'merchant_sales']).orderBy('id').pluck('email');
    },

    /** Whoever placed the order, or the contractor's owners when that person has left. */
    async contractorEmails(order: Pick<OrderRow, 'placed_by' | 'contractor_organisation_id'>, trx: Db = db): Promise<string[]> {
      if (order.placed_by) {
        const placer = await trx('users').where({ id: order.placed_by, organisation_id: order.contractor_organisation_id }).first();
        if (placer) return [placer.email];
      }
      return trx('users').where({ organisation_id: order.contractor_organisation_id, role: 'contractor_owner' }).orderBy('id').pluck('email');
    },
  };
}
