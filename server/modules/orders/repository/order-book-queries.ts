import type { z } from 'zod';
import { addDays } from '../../../../shared/domain/business-calendar';
import { ORDER_COUNT_CAP, type orderBookQuerySchema } from '../../../../shared/schemas/order.schema';
import { peekRow, type Db } from '../../../db/knex';
import type { OrderParty, OrderRow } from '../orders.repository';
import { ORDER_COLUMNS, lineCount, scoped, toOrder } from './order-row';

type ListFilter = z.output<typeof orderBookQuerySchema>;

const likePattern = (q: string) => `%${q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

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

/** The order book: its count, its pages, and the change counter its kept pages are filed under. */
export function orderBookRepository(db: Db) {
  return {
    /** How many orders match the filter, stopping at ORDER_COUNT_CAP (paging and sort play no part). */
    async count(party: OrderParty, f: ListFilter): Promise<{ total: number; capped: boolean }> {
      const matches = bookFilter(
        db,
        party,
        f,
      )(db('orders as o'))
        .select(db.raw('1'))
        .limit(ORDER_COUNT_CAP + 1);
      const counted = Number((await db.from(matches.as('m')).count({ n: '*' }).first())?.n ?? 0);
      return { total: Math.min(counted, ORDER_COUNT_CAP), capped: counted > ORDER_COUNT_CAP };
    },

    /** One page of the book in the asked order: the ids are paged on an index, then only those rows are joined. */
    async page(party: OrderParty, f: ListFilter): Promise<OrderRow[]> {
      const ids = (await bookFilter(
        db,
        party,
        f,
      )(db('orders as o'))
        .orderBy([
          { column: `o.${f.sort}`, order: f.dir },
          { column: 'o.id', order: f.dir },
        ])
        .limit(f.page_size)
        .offset((f.page - 1) * f.page_size)
        .pluck('o.id')) as number[];
      if (ids.length === 0) return [];
      const rows = await scoped(db, party)
        .whereIn('o.id', ids)
        .select([...ORDER_COLUMNS, lineCount(db)]);
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
  };
}
