import { addDays } from '../../../shared/domain/business-calendar';
import type {
  SubstituteFigures,
  OrderComment,
  OrderEvent,
  OrderLine,
  OrderLineStatus,
  OrderSite,
  OrderStatus,
  Proposal,
  orderBookQuerySchema,
} from '../../../shared/schemas/order.schema';
import { ORDER_COUNT_CAP } from '../../../shared/schemas/order.schema';
import { invoiceNumber } from '../../../shared/schemas/invoice.schema';
import type { z } from 'zod';
import { peekRow, type Db } from '../../db/knex';
import { nowIso } from '../../db/time';

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

type ListFilter = z.output<typeof orderBookQuerySchema>;

const ORDER_COLUMNS = [
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


const likePattern = (q: string) => `%${q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

function toOrder(r: Record<string, unknown>): OrderRow {
  return { ...(r as unknown as OrderRow), site: JSON.parse(r.site as string) as OrderSite, line_count: Number(r.line_count ?? 0) };
}

function toLine(r: Record<string, unknown>): StoredOrderLine {
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

export type StoredOrderLine = OrderLine & { delivered_quantity: number | null };

/**
 * The order book's filter, in SQL. The count needs none of the joins (they follow not-null foreign
 * keys), so it runs on an index alone, and it stops at ORDER_COUNT_CAP: counting every one of
 * 100,000 orders on each page turn costs more than the page itself.
 */
function bookFilter(db: Db, party: OrderParty, f: ListFilter) {
  const ref = f.q ? f.q.match(/^(?:rl-?)?0*(\d{1,9})$/i) : null;
  return (q: ReturnType<Db>) => {
    if (party.kind === 'contractor') q.where('o.contractor_organisation_id', party.organisationId);
    else q.where('o.merchant_organisation_id', party.organisationId);
    if (f.status) q.where('o.status', f.status);
    if (f.statuses && f.statuses.length > 0) q.whereIn('o.status', f.statuses);
    if (f.branch_id) q.where('o.branch_id', f.branch_id);
    if (f.project_id) q.where('o.project_id', f.project_id);
    if (f.contractor_id) q.where('o.contractor_organisation_id', f.contractor_id);
    // placed_at is an ISO timestamp: a day range runs from the day's start to the next day's start.
    if (f.date_from) q.where(`o.${f.date_field}`, '>=', f.date_from);
    if (f.date_to) {
      if (f.date_field === 'placed_at') q.where('o.placed_at', '<', addDays(f.date_to, 1));
      else q.where('o.requested_date', '<=', f.date_to);
    }
    if (f.q) {
      const pattern = likePattern(f.q);
      q.where((w) => {
        if (ref) w.orWhere('o.id', Number(ref[1]));
        w.orWhereRaw(`lower(??) like ? escape '\\'`, ['o.po_reference', pattern]).orWhereRaw(`lower(??) like ? escape '\\'`, ['o.site_name', pattern]);
        w.orWhereExists(db('organisations as co').whereRaw('?? = ??', ['co.id', 'o.contractor_organisation_id']).whereRaw(`lower(??) like ? escape '\\'`, ['co.name', pattern]));
        w.orWhereExists(db('branches as b').whereRaw('?? = ??', ['b.id', 'o.branch_id']).whereRaw(`lower(??) like ? escape '\\'`, ['b.name', pattern]));
      });
    }
    return q;
  };
}

export function ordersRepository(db: Db) {
  const scoped = (trx: Db, party: OrderParty) => {
    const q = trx('orders as o')
      .join('organisations as co', 'co.id', 'o.contractor_organisation_id')
      .join('organisations as mo', 'mo.id', 'o.merchant_organisation_id')
      .join('branches as b', 'b.id', 'o.branch_id');
    if (party.kind === 'contractor') q.where('o.contractor_organisation_id', party.organisationId);
    else q.where('o.merchant_organisation_id', party.organisationId);
    return q;
  };

  const lineCount = (trx: Db) => trx('order_lines as ol').count('*').whereRaw('?? = ??', ['ol.order_id', 'o.id']).as('line_count');

  return {
    async insertOrder(
      trx: Db,
      o: Omit<OrderRow, 'id' | 'contractor_name' | 'merchant_name' | 'branch_name' | 'branch_town' | 'line_count' | 'revision' | 'confirmed_at' | 'cancelled_at' | 'updated_at' | 'follows_order_id'> & { follows_order_id?: number | null },
      lines: NewOrderLine[],
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
      await this.insertLines(trx, id, lines, 1);
      return id;
    },

    async insertLines(trx: Db, orderId: number, lines: NewOrderLine[], firstPosition: number): Promise<number[]> {
      const ids: number[] = [];
      for (const [i, l] of lines.entries()) {
        const [row] = await trx('order_lines')
          .insert({
            order_id: orderId,
            position: firstPosition + i,
            product_id: l.product_id,
            sku: l.sku,
            description: l.description,
            category: l.category,
            unit: l.unit,
            pack_size: l.pack_size,
            pack_weight_kg: l.pack_weight_kg,
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
    },

    async replaceLines(trx: Db, orderId: number, lines: NewOrderLine[]): Promise<void> {
      await trx('order_lines').where({ order_id: orderId }).delete();
      await this.insertLines(trx, orderId, lines, 1);
    },

    async updateLine(trx: Db, lineId: number, values: Partial<Pick<OrderLine, 'quantity' | 'confirmed_quantity' | 'back_order_quantity' | 'total' | 'status'>>): Promise<void> {
      await trx('order_lines').where({ id: lineId }).update(values);
    },

    async find(party: OrderParty, id: number, trx: Db = db): Promise<OrderRow | undefined> {
      const row = await scoped(trx, party).where('o.id', id).select([...ORDER_COLUMNS, lineCount(trx)]).first();
      return row ? toOrder(row) : undefined;
    },

    /**
     * The order book, filtered, sorted and paged in SQL. The count needs none of the joins (they
     * follow not-null foreign keys), so it runs on an index alone, and it stops at ORDER_COUNT_CAP:
     * counting every one of 100,000 orders on each page turn costs more than the page itself.
     */
    /** How many orders match the filter, stopping at ORDER_COUNT_CAP (paging and sort play no part). */
    async count(party: OrderParty, f: ListFilter): Promise<{ total: number; capped: boolean }> {
      const matches = bookFilter(db, party, f)(db('orders as o')).select(db.raw('1')).limit(ORDER_COUNT_CAP + 1);
      const counted = Number((await db.from(matches.as('m')).count({ n: '*' }).first())?.n ?? 0);
      return { total: Math.min(counted, ORDER_COUNT_CAP), capped: counted > ORDER_COUNT_CAP };
    },

    /** One page of the book in the asked order: the ids are paged on an index, then only those rows are joined. */
    async page(party: OrderParty, f: ListFilter): Promise<OrderRow[]> {
      const ids = (await bookFilter(db, party, f)(db('orders as o'))
        .orderBy([
          { column: `o.${f.sort}`, order: f.dir },
          { column: 'o.id', order: f.dir },
        ])
        .limit(f.page_size)
        .offset((f.page - 1) * f.page_size)
        .pluck('o.id')) as number[];
      if (ids.length === 0) return [];
      const rows = await scoped(db, party).whereIn('o.id', ids).select([...ORDER_COLUMNS, lineCount(db)]);
      const byId = new Map(rows.map((r) => [r.id as number, r]));
      return ids.map((oid) => toOrder(byId.get(oid)!));
    },

    /** What changes whenever anything an order-book row shows changes (kept by triggers in the database). */
    async bookVersion(organisationId: number): Promise<number> {
      const peeked = peekRow<{ version: number }>(db, 'select version from order_book_versions where organisation_id = ?', organisationId);
      if (peeked) return peeked.row?.version ?? 0;
      const row = (await db('order_book_versions').where('organisation_id', organisationId).first('version')) as { version: number } | undefined;
      return row?.version ?? 0;
    },

    /**
     * Changes an order only if it is still in one of the given stages (and, when given, at the given
     * revision), so two people acting at once cannot both win. Returns whether it changed.
     */
    async updateIf(
      trx: Db,
      id: number,
      guard: { statuses: readonly OrderStatus[]; revision?: number },
      values: Record<string, unknown>,
      bumpRevision: boolean,
    ): Promise<boolean> {
      const q = trx('orders').where('id', id).whereIn('status', guard.statuses as OrderStatus[]);
      if (guard.revision !== undefined) q.where('revision', guard.revision);
      const n = await q.update({
        ...values,
        ...(bumpRevision ? { revision: trx.raw('?? + 1', ['revision']) } : {}),
        updated_at: nowIso(),
      });
      return n > 0;
    },

    /** A line after the desk's confirmation: what it sends now, what follows, what is held from stock. */
    async setConfirmed(trx: Db, lineId: number, v: { confirmed_quantity: number; back_order_quantity: number; reserved_quantity: number; total: number; status: OrderLineStatus }): Promise<void> {
      await trx('order_lines').where({ id: lineId }).update(v);
    },

    async setDelivered(trx: Db, lineId: number, delivered: number): Promise<void> {
      await trx('order_lines').where({ id: lineId }).update({ delivered_quantity: delivered, reserved_quantity: 0 });
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

    async insertComment(trx: Db, orderId: number, c: { userId: number; name: string; organisationId: number; body: string }): Promise<number> {
      const [row] = await trx('order_comments')
        .insert({ order_id: orderId, author_user_id: c.userId, author_name: c.name, author_organisation_id: c.organisationId, body: c.body, created_at: nowIso() })
        .returning('id');
      return (row as { id: number }).id;
    },

    async invoiceOf(orderId: number, trx: Db = db): Promise<{ id: number; number: string } | null> {
      const row = await trx('invoices').where({ order_id: orderId }).first('id', 'number');
      return row ? { id: row.id, number: invoiceNumber(row.number) } : null;
    },

    async lines(orderId: number, trx: Db = db): Promise<StoredOrderLine[]> {
      const rows = await trx('order_lines').where({ order_id: orderId }).orderBy('position');
      return rows.map(toLine);
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

    async insertProposal(
      trx: Db,
      p: {
        order_id: number;
        order_revision: number;
        message: string;
        proposed_date: string | null;
        proposed_time_window: string | null;
        proposed_slot_id: number | null;
        proposed_by: number;
      },
      lines: {
        order_line_id: number;
        confirmed_quantity: number;
        back_order_quantity: number;
        substitute_product_id: number | null;
        substitute_quantity: number | null;
        substitute_unit_price: number | null;
        substitute_figures: SubstituteFigures | null;
        note: string;
      }[],
    ): Promise<number> {
      const [row] = await trx('order_proposals').insert({ ...p, status: 'open', proposed_at: nowIso() }).returning('id');
      const id = (row as { id: number }).id;
      if (lines.length > 0) {
        await trx('order_proposal_lines').insert(lines.map((l) => ({ ...l, substitute_figures: l.substitute_figures ? JSON.stringify(l.substitute_figures) : null, proposal_id: id })));
      }
      return id;
    },

    /** Open proposals made on an older revision no longer answer the order as it stands. */
    async supersedeOpenProposals(trx: Db, orderId: number): Promise<void> {
      await trx('order_proposals').where({ order_id: orderId, status: 'open' }).update({ status: 'superseded' });
    },

    async answerProposal(trx: Db, proposalId: number, status: 'accepted' | 'declined', userId: number): Promise<boolean> {
      const n = await trx('order_proposals').where({ id: proposalId, status: 'open' }).update({ status, answered_by: userId, answered_at: nowIso() });
      return n > 0;
    },

    async proposals(orderId: number, trx: Db = db): Promise<Proposal[]> {
      const rows = await trx('order_proposals as p')
        .leftJoin('users as pu', 'pu.id', 'p.proposed_by')
        .leftJoin('users as au', 'au.id', 'p.answered_by')
        .where('p.order_id', orderId)
        .select('p.*', 'pu.name as proposed_by_name', 'au.name as answered_by_name')
        .orderBy('p.id');
      if (rows.length === 0) return [];
      const lines = await trx('order_proposal_lines as pl')
        .join('order_lines as ol', 'ol.id', 'pl.order_line_id')
        .leftJoin('products as sp', 'sp.id', 'pl.substitute_product_id')
        .whereIn(
          'pl.proposal_id',
          rows.map((r) => r.id),
        )
        .select(
          'pl.*',
          'ol.sku',
          'ol.description',
          'ol.quantity',
          'sp.sku as sub_sku',
          'sp.name as sub_name',
          'sp.unit as sub_unit',
          'sp.pack_size as sub_pack_size',
        )
        .orderBy('pl.id');
      return rows.map((r) => ({
        id: r.id,
        status: r.status,
        order_revision: r.order_revision,
        message: r.message,
        proposed_date: r.proposed_date,
        proposed_time_window: r.proposed_time_window,
        proposed_slot_id: r.proposed_slot_id,
        proposed_at: r.proposed_at,
        proposed_by: r.proposed_by ? { id: r.proposed_by, name: r.proposed_by_name } : null,
        answered_at: r.answered_at,
        answered_by: r.answered_by ? { id: r.answered_by, name: r.answered_by_name } : null,
        lines: lines
          .filter((l) => l.proposal_id === r.id)
          .map((l) => ({
            order_line_id: l.order_line_id,
            sku: l.sku,
            description: l.description,
            quantity: l.quantity,
            confirmed_quantity: l.confirmed_quantity,
            back_order_quantity: l.back_order_quantity,
            substitute: l.substitute_product_id
              ? {
                  product_id: l.substitute_product_id,
                  sku: l.sub_sku,
                  description: l.sub_name,
                  unit: l.sub_unit,
                  pack_size: l.sub_pack_size,
                  quantity: l.substitute_quantity,
                  unit_price: l.substitute_unit_price,
                  total: l.substitute_quantity * l.substitute_unit_price,
                  figures: l.substitute_figures ? (JSON.parse(l.substitute_figures) as SubstituteFigures) : null,
                }
              : null,
            note: l.note,
          })),
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

export type OrdersRepository = ReturnType<typeof ordersRepository>;
