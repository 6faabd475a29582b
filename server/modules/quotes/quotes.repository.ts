import { jsonTextSql } from '../../db/dialect';
import type { Knex } from 'knex';
import type { z } from 'zod';
import type { OrderSite, Quote, QUOTE_REQUEST_STATUSES, QUOTE_STATUSES, quoteRequestListQuerySchema } from '../../../shared/schemas/order.schema';
import type { ProductCategory } from '../../../shared/schemas/catalogue.schema';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';
import type { OrderParty } from '../orders/orders.repository';

type QuoteLineFigures = Omit<Quote['lines'][number], 'request_line_id'>;

/** A quote line's product, packs and price: the same columns in the `quote_lines` row as in the API's line, read or written. */
function quoteLineFigures(l: QuoteLineFigures): QuoteLineFigures {
  return { product_id: l.product_id, sku: l.sku, description: l.description, unit: l.unit, pack_size: l.pack_size, packs: l.packs, unit_price: l.unit_price, total: l.total, note: l.note };
}

type RequestListFilter = z.output<typeof quoteRequestListQuerySchema>;

type RequestStatus = (typeof QUOTE_REQUEST_STATUSES)[number];
type QuoteStatus = (typeof QUOTE_STATUSES)[number];

export interface QuoteRequestRow {
  id: number;
  contractor_organisation_id: number;
  contractor_name: string;
  project_id: number;
  estimate_id: number;
  status: RequestStatus;
  requested_date: string;
  time_window: string | null;
  delivery_method: 'ground' | 'roof';
  po_reference: string;
  notes: string;
  site: OrderSite;
  created_by: number | null;
  created_at: string;
  updated_at: string;
}

export interface RequestLineRow {
  id: number;
  position: number;
  category: ProductCategory;
  description: string;
  quantity: number;
  unit: string;
}

export interface QuoteRow extends Omit<Quote, 'status_label'> {
  quote_request_id: number;
  merchant_organisation_id: number;
}

const REQUEST_COLUMNS = [
  'r.id',
  'r.contractor_organisation_id',
  'co.name as contractor_name',
  'r.project_id',
  'r.estimate_id',
  'r.status',
  'r.requested_date',
  'r.time_window',
  'r.delivery_method',
  'r.po_reference',
  'r.notes',
  'r.site',
  'r.created_by',
  'r.created_at',
  'r.updated_at',
];

const toRequest = (r: Record<string, unknown>): QuoteRequestRow => ({ ...(r as unknown as QuoteRequestRow), site: JSON.parse(r.site as string) as OrderSite });

export function quotesRepository(db: Db) {
  /** A contractor sees its own requests; a merchant the requests that include one of its branches. */
  const scopedRequests = (trx: Db, party: OrderParty) => {
    const q = trx('quote_requests as r').join('organisations as co', 'co.id', 'r.contractor_organisation_id');
    if (party.kind === 'contractor') q.where('r.contractor_organisation_id', party.organisationId);
    else q.whereExists((w) => w.select('*').from('quotes as mq').whereRaw('?? = ??', ['mq.quote_request_id', 'r.id']).andWhere('mq.merchant_organisation_id', party.organisationId));
    return q;
  };

  async function quotesOf(requestIds: number[], party: OrderParty, trx: Db): Promise<QuoteRow[]> {
    if (requestIds.length === 0) return [];
    const q = trx('quotes as q')
      .join('branches as b', 'b.id', 'q.branch_id')
      .join('organisations as mo', 'mo.id', 'q.merchant_organisation_id')
      .whereIn('q.quote_request_id', requestIds)
      .select('q.*', 'b.name as branch_name', 'b.town as branch_town', 'mo.name as merchant_name')
      .orderBy('q.id');
    if (party.kind === 'merchant') q.where('q.merchant_organisation_id', party.organisationId);
    const rows = await q;
    const lines =
      rows.length === 0
        ? []
        : await trx('quote_lines')
            .whereIn(
              'quote_id',
              rows.map((r) => r.id),
            )
            .orderBy('id');
    return rows.map((r) => ({
      id: r.id,
      quote_request_id: r.quote_request_id,
      merchant_organisation_id: r.merchant_organisation_id,
      status: r.status,
      branch: { id: r.branch_id, name: r.branch_name, town: r.branch_town, merchant: { id: r.merchant_organisation_id, name: r.merchant_name } },
      message: r.message,
      valid_until: r.valid_until,
      total: r.total,
      answered_at: r.answered_at,
      order_id: r.order_id,
      lines: lines
        .filter((l) => l.quote_id === r.id)
        .map((l) => ({
          request_line_id: l.quote_request_line_id,
          ...quoteLineFigures(l),
        })),
    }));
  }

  return {
    async insertRequest(
      trx: Db,
      r: Omit<QuoteRequestRow, 'id' | 'contractor_name' | 'status' | 'created_at' | 'updated_at'>,
      lines: Omit<RequestLineRow, 'id' | 'position'>[],
      branches: { id: number; merchantId: number }[],
    ): Promise<number> {
      const now = nowIso();
      const [row] = await trx('quote_requests')
        .insert({ ...r, site: JSON.stringify(r.site), status: 'open', created_at: now, updated_at: now })
        .returning('id');
      const id = (row as { id: number }).id;
      await trx('quote_request_lines').insert(lines.map((l, i) => ({ ...l, quote_request_id: id, position: i + 1 })));
      await trx('quotes').insert(branches.map((b) => ({ quote_request_id: id, branch_id: b.id, merchant_organisation_id: b.merchantId, status: 'asked', created_at: now })));
      return id;
    },

    async findRequest(party: OrderParty, id: number, trx: Db = db): Promise<QuoteRequestRow | undefined> {
      const row = await scopedRequests(trx, party).where('r.id', id).select(REQUEST_COLUMNS).first();
      return row ? toRequest(row) : undefined;
    },

    /** A page of the caller's quote requests, filtered and sorted in SQL, with how many match. */
    async listRequests(party: OrderParty, f: RequestListFilter): Promise<{ rows: QuoteRequestRow[]; total: number }> {
      const filtered = () => {
        const q = scopedRequests(db, party);
        if (f.status) q.where('r.status', f.status);
        if (f.waiting !== undefined && party.kind === 'merchant') {
          const mine = (w: Knex.QueryBuilder) =>
            w.select('*').from('quotes as wq').whereRaw('?? = ??', ['wq.quote_request_id', 'r.id']).andWhere('wq.merchant_organisation_id', party.organisationId).andWhere('wq.status', 'asked');
          if (f.waiting) q.whereExists(mine);
          else q.whereNotExists(mine);
        }
        if (f.q) {
          const ref = f.q.match(/^(?:q-?)?0*(\d{1,9})$/i);
          const pattern = `%${f.q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
          q.where((w) => {
            if (ref) w.orWhere('r.id', Number(ref[1]));
            w.orWhereRaw(`lower(??) like ? escape '\\'`, ['co.name', pattern])
              .orWhereRaw(`lower(${jsonTextSql(db, ['name'])}) like ? escape '\\'`, ['r.site', pattern])
              .orWhereRaw(`lower(??) like ? escape '\\'`, ['r.po_reference', pattern]);
          });
        }
        return q;
      };
      const counted = await db.from(filtered().select('r.id').as('m')).count({ n: '*' }).first();
      const rows = await filtered()
        .select(REQUEST_COLUMNS)
        .orderBy([
          { column: `r.${f.sort}`, order: f.dir },
          { column: 'r.id', order: f.dir },
        ])
        .limit(f.page_size)
        .offset((f.page - 1) * f.page_size);
      return { rows: rows.map(toRequest), total: Number(counted?.n ?? 0) };
    },

    async requestLines(requestId: number, trx: Db = db): Promise<RequestLineRow[]> {
      return trx('quote_request_lines').where({ quote_request_id: requestId }).orderBy('position').select('id', 'position', 'category', 'description', 'quantity', 'unit');
    },

    quotesOf: (requestIds: number[], party: OrderParty, trx: Db = db) => quotesOf(requestIds, party, trx),

    /** A quote the caller's side may act on: the merchant's own, or one answering the contractor's request. */
    async findQuote(party: OrderParty, quoteId: number, trx: Db = db): Promise<QuoteRow | undefined> {
      const q = trx('quotes as q').join('quote_requests as r', 'r.id', 'q.quote_request_id').where('q.id', quoteId).select('q.quote_request_id');
      if (party.kind === 'merchant') q.where('q.merchant_organisation_id', party.organisationId);
      else q.where('r.contractor_organisation_id', party.organisationId);
      const found = await q.first();
      if (!found) return undefined;
      return (await quotesOf([found.quote_request_id], party, trx)).find((x) => x.id === quoteId);
    },

    async replaceAnswer(trx: Db, quoteId: number, answer: { message: string; valid_until: string | null; total: number; answered_by: number }, lines: Omit<Quote['lines'][number], never>[]): Promise<boolean> {
      const n = await trx('quotes')
        .where({ id: quoteId })
        .whereIn('status', ['asked', 'answered'])
        .update({ ...answer, status: 'answered', answered_at: nowIso() });
      if (n === 0) return false;
      await trx('quote_lines').where({ quote_id: quoteId }).delete();
      await trx('quote_lines').insert(
        lines.map((l) => ({
          quote_id: quoteId,
          quote_request_line_id: l.request_line_id,
          ...quoteLineFigures(l),
        })),
      );
      return true;
    },

    async setQuoteStatus(trx: Db, quoteId: number, from: QuoteStatus[], to: QuoteStatus, values: Record<string, unknown> = {}): Promise<boolean> {
      const n = await trx('quotes')
        .where({ id: quoteId })
        .whereIn('status', from)
        .update({ ...values, status: to });
      return n > 0;
    },

    /** Every other quote of the request stops: withdrawn, or not chosen when another was accepted. */
    async closeOtherQuotes(trx: Db, requestId: number, exceptQuoteId: number | null, to: QuoteStatus): Promise<void> {
      const q = trx('quotes').where({ quote_request_id: requestId }).whereIn('status', ['asked', 'answered']);
      if (exceptQuoteId !== null) q.whereNot('id', exceptQuoteId);
      await q.update({ status: to });
    },

    async setRequestStatus(trx: Db, requestId: number, from: RequestStatus, to: RequestStatus): Promise<boolean> {
      const n = await trx('quote_requests').where({ id: requestId, status: from }).update({ status: to, updated_at: nowIso() });
      return n > 0;
    },
  };
}

export type QuotesRepository = ReturnType<typeof quotesRepository>;
