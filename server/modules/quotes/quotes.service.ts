import type { z } from 'zod';
import { bookingDateProblem } from '../../../shared/domain/booking-window';
import { QUOTE_STATUS_LABELS, type QuoteRequest, type answerQuoteBodySchema, type createQuoteRequestBodySchema, type quoteRequestListQuerySchema } from '../../../shared/schemas/order.schema';
import type { AppDeps } from '../../app-deps';
import type { Db } from '../../db/knex';
import type { AuthUser } from '../../auth/auth-user';
import { nowIso } from '../../db/time';
import { AppError } from '../../http/app-error';
import { enqueueMail } from '../../mail/outbox';
import { renderEmail } from '../../mail/templates';
import { catalogueRepository } from '../catalogue/catalogue.repository';
import { packsFor } from '../estimates/bill-of-materials';
import { orderCautions } from '../estimates/cautions';
import { estimatesRepository } from '../estimates/estimates.repository';
import { ordersRepository } from '../orders/orders.repository';
import { partyOf, type OrdersService } from '../orders/orders.service';
import { orderSiteOf } from '../projects/order-site';
import { projectsService } from '../projects/projects.service';
import { quotesRepository, type QuoteRequestRow, type QuoteRow, type RequestLineRow } from './quotes.repository';

type CreateBody = z.output<typeof createQuoteRequestBodySchema>;
type AnswerBody = z.output<typeof answerQuoteBodySchema>;
type RequestListQuery = z.output<typeof quoteRequestListQuerySchema>;

const invalid = (path: string, message: string) => AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path, message }]);

/** Each request line against each quote: what that merchant offers for it, and each quote's total. */
export function compareQuotes(lines: RequestLineRow[], quotes: QuoteRow[]): NonNullable<QuoteRequest['comparison']> {
  const priced = quotes.filter((q) => q.status === 'answered' || q.status === 'accepted' || q.status === 'not_chosen');
  return {
    quote_ids: quotes.map((q) => q.id),
    rows: lines.map((l) => ({
      request_line_id: l.id,
      category: l.category,
      description: l.description,
      quantity: Number(l.quantity),
      unit: l.unit,
      offers: quotes.map((q) => {
        const ql = priced.includes(q) ? q.lines.find((x) => x.request_line_id === l.id) : undefined;
        return ql ? { sku: ql.sku, description: ql.description, packs: ql.packs, unit_price: ql.unit_price, total: ql.total } : null;
      }),
    })),
    totals: quotes.map((q) => {
      const offered = priced.includes(q) ? lines.filter((l) => q.lines.some((x) => x.request_line_id === l.id)).length : 0;
      return { quote_id: q.id, total: priced.includes(q) ? q.total : null, lines_offered: offered, lines_missing: lines.length - offered };
    }),
  };
}

/** What a quote request is headed by, alike in the list and on its own page: who asked, for which site, for when. */
function requestHeading(r: QuoteRequestRow) {
  return {
    id: r.id,
    status: r.status,
    contractor: { id: r.contractor_organisation_id, name: r.contractor_name },
    project: { id: r.project_id, name: r.site.name },
    requested_date: r.requested_date,
    created_at: r.created_at,
    updated_at: r.updated_at,
  };
}

export function quotesService(deps: Pick<AppDeps, 'db' | 'mailer' | 'logger' | 'config'>, orders: OrdersService) {
  const { db, config } = deps;
  const quotes = quotesRepository(db);
  const catalogue = catalogueRepository(db);
  const estimates = estimatesRepository(db);
  const ordersRepo = ordersRepository(db);
  const projects = projectsService(deps);

  /** Writes a quote request's e-mails to the outbox in `trx`, the transaction of the change they report. */
  async function mail(trx: Db, to: string[], subject: string, heading: string, paragraphs: string[], requestId: number) {
    const url = `${config.appUrl}/quotes/${requestId}`;
    for (const address of to) {
      await enqueueMail(trx, renderEmail({ to: address, subject, heading, paragraphs, action: { label: 'Open the quote request', url } }), config.mailDomain);
    }
  }

  async function requesterEmails(r: QuoteRequestRow, trx: Db) {
    return ordersRepo.contractorEmails({ placed_by: r.created_by, contractor_organisation_id: r.contractor_organisation_id }, trx);
  }

  async function get(user: AuthUser, id: number): Promise<QuoteRequest> {
    const party = partyOf(user);
    const r = await quotes.findRequest(party, id);
    if (!r) throw AppError.notFound('Quote request');
    const [lines, qs] = await Promise.all([quotes.requestLines(id), quotes.quotesOf([id], party)]);
    return {
      ...requestHeading(r),
      site: r.site,
      estimate_id: r.estimate_id,
      time_window: r.time_window,
      delivery_method: r.delivery_method,
      po_reference: r.po_reference,
      notes: r.notes,
      lines: lines.map((l) => ({ ...l, quantity: Number(l.quantity) })),
      quotes: qs.map(({ quote_request_id: _r, merchant_organisation_id: _m, ...q }) => ({ ...q, status_label: QUOTE_STATUS_LABELS[q.status] })),
      comparison: party.kind === 'contractor' ? compareQuotes(lines, qs) : null,
      cautions: orderCautions(r.delivery_method, r.site),
    };
  }

  async function merchantQuote(user: AuthUser, quoteId: number) {
    if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
    const quote = await quotes.findQuote(partyOf(user), quoteId);
    if (!quote) throw AppError.notFound('Quote');
    const request = (await quotes.findRequest(partyOf(user), quote.quote_request_id))!;
    if (request.status !== 'open' || !['asked', 'answered'].includes(quote.status)) {
      throw AppError.conflict('quote_closed', 'This quote request is closed');
    }
    return { quote, request };
  }

  return {
    get,

    async list(user: AuthUser, query: RequestListQuery) {
      const party = partyOf(user);
      const { rows: requests, total } = await quotes.listRequests(party, query);
      const all = await quotes.quotesOf(
        requests.map((r) => r.id),
        party,
      );
      return {
        quote_requests: requests.map((r) => ({
          ...requestHeading(r),
          quotes: all.filter((q) => q.quote_request_id === r.id).map((q) => ({ id: q.id, status: q.status, branch: q.branch, total: q.total })),
        })),
        total,
        page: query.page,
        page_size: query.page_size,
      };
    },

    /** One estimate's needs sent to up to three branches; each answers with its own products and prices. */
    async create(user: AuthUser, body: CreateBody) {
      const estimate = await estimates.find(user.organisation.id, body.estimate_id);
      if (!estimate) throw invalid('estimate_id', 'is not an estimate of yours');
      await projects.requireOpen(user, estimate.project_id);
      const dateProblem = bookingDateProblem(config.calendar, body.requested_date);
      if (dateProblem) throw invalid('requested_date', dateProblem);
      const branches = await catalogue.branchesByIds(body.branch_ids);
      const missing = body.branch_ids.map((b, i) => (branches.has(b) ? null : { path: `branch_ids.${i}`, message: 'is not a merchant branch' })).filter((x) => x !== null);
      if (missing.length > 0) throw AppError.unprocessable('validation_failed', 'Some branches are not merchant branches', missing);
      const p = await projects.get(user, estimate.project_id);
      if (body.delivery_method === 'roof' && p.crane_lift === 'not_allowed') {
        throw invalid('delivery_method', "the site's access notes say the lorry crane cannot lift there");
      }
      const lines = (await estimates.lines(estimate.id)).map((l) => ({ category: l.category, description: l.description, quantity: l.quantity, unit: l.unit }));
      if (lines.length === 0) throw invalid('estimate_id', 'this estimate has nothing to price');
      const site = orderSiteOf(p);
      const id = await db.transaction(async (trx) => {
        const requestId = await quotes.insertRequest(
          trx,
          {
            contractor_organisation_id: user.organisation.id,
            project_id: estimate.project_id,
            estimate_id: estimate.id,
            requested_date: body.requested_date,
            time_window: body.time_window ?? null,
            delivery_method: body.delivery_method,
            po_reference: body.po_reference ?? '',
            notes: body.notes ?? '',
            site,
            created_by: user.id,
          },
          lines,
          body.branch_ids.map((b) => ({ id: b, merchantId: branches.get(b)!.merchant.id })),
        );
        for (const b of body.branch_ids.map((x) => branches.get(x)!)) {
          await mail(
            trx,
            await ordersRepo.deskEmails(b.merchant.id, trx),
            `Quote request from ${user.organisation.name} for ${b.name}`,
            `Quote request for ${b.name}`,
            [`${user.organisation.name} asks for prices on ${lines.length} lines for delivery to ${p.site_postcode || p.name} on ${body.requested_date}.`],
            requestId,
          );
        }
        return requestId;
      });
      return get(user, id);
    },

    /** The desk prices the lines it can supply with its own products; the branch's price unless it gives one. */
    async answer(user: AuthUser, quoteId: number, body: AnswerBody) {
      const { quote, request } = await merchantQuote(user, quoteId);
      const requestLines = await quotes.requestLines(request.id);
      const products = await catalogue.branchProducts(
        quote.branch.id,
        body.lines.map((l) => l.product_id),
      );
      const problems: { path: string; message: string }[] = [];
      const seen = new Set<number>();
      const lines = body.lines.map((l, i) => {
        const rl = requestLines.find((x) => x.id === l.request_line_id);
        const p = products.get(l.product_id);
        if (!rl) problems.push({ path: `lines.${i}.request_line_id`, message: 'is not a line of this request' });
        else if (seen.has(rl.id)) problems.push({ path: `lines.${i}.request_line_id`, message: 'is priced twice' });
        else seen.add(rl.id);
        if (!p) problems.push({ path: `lines.${i}.product_id`, message: `is not a product ${quote.branch.name} sells` });
        if (!rl || !p) return null;
        const packs = l.packs ?? packsFor(Number(rl.quantity), p.pack_size);
        const unitPrice = l.unit_price ?? p.pack_price;
        return {
          request_line_id: rl.id,
          product_id: p.id,
          sku: p.sku,
          description: p.name,
          unit: p.unit,
          pack_size: p.pack_size,
          packs,
          unit_price: unitPrice,
          total: packs * unitPrice,
          note: l.note ?? '',
        };
      });
      if (body.valid_until && body.valid_until < config.calendar.today()) problems.push({ path: 'valid_until', message: 'must be today or later' });
      if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'Some lines of the quote are not valid', problems);
      const priced = lines.filter((l) => l !== null);
      const total = priced.reduce((s, l) => s + l.total, 0);
      const ok = await db.transaction(async (trx) => {
        if (!(await quotes.replaceAnswer(trx, quoteId, { message: body.message ?? '', valid_until: body.valid_until ?? null, total, answered_by: user.id }, priced))) return false;
        await mail(
          trx,
          await requesterEmails(request, trx),
          `${quote.branch.name} priced your quote request`,
          `A price from ${quote.branch.name}`,
          [`${quote.branch.merchant.name} priced ${priced.length} of ${requestLines.length} lines. Compare the answers side by side in Ridgeload before you accept one.`],
          request.id,
        );
        return true;
      });
      if (!ok) throw AppError.conflict('quote_closed', 'This quote request is closed');
      return get(user, request.id);
    },

    async decline(user: AuthUser, quoteId: number, message?: string) {
      const { quote, request } = await merchantQuote(user, quoteId);
      const ok = await db.transaction(async (trx) => {
        if (!(await quotes.setQuoteStatus(trx, quoteId, ['asked', 'answered'], 'declined', { message: message ?? '', answered_by: user.id, answered_at: nowIso() }))) return false;
        await mail(trx, await requesterEmails(request, trx), `${quote.branch.name} cannot quote`, `No price from ${quote.branch.name}`, [message ?? 'The branch cannot supply this request.'], request.id);
        return true;
      });
      if (!ok) throw AppError.conflict('quote_closed', 'This quote request is closed');
      return get(user, request.id);
    },

    /** The chosen quote becomes an order at its prices, in the same transaction that closes the others. */
    async accept(user: AuthUser, quoteId: number) {
      const party = partyOf(user);
      const quote = await quotes.findQuote(party, quoteId);
      if (!quote) throw AppError.notFound('Quote');
      const request = (await quotes.findRequest(party, quote.quote_request_id))!;
      if (request.status !== 'open') throw AppError.conflict('quote_closed', 'This quote request is closed');
      if (quote.status !== 'answered') throw AppError.conflict('quote_not_priced', `${quote.branch.name} has not priced this request`);
      if (quote.valid_until && quote.valid_until < config.calendar.today()) throw AppError.conflict('quote_expired', `This price was valid until ${quote.valid_until}`);
      const products = await catalogue.branchProducts(
        quote.branch.id,
        quote.lines.map((l) => l.product_id).filter((p): p is number => p !== null),
      );
      const lines = quote.lines.map((l) => {
        const p = l.product_id !== null ? products.get(l.product_id) : undefined;
        if (!p) throw AppError.conflict('quote_product_unavailable', `${l.sku ?? l.description} is no longer sold by ${quote.branch.name}`);
        return orders.newLine(p, l.packs, 'asked', l.unit_price);
      });
      const order = await orders.place(
        user,
        {
          estimate_id: request.estimate_id,
          branch_id: quote.branch.id,
          requested_date: request.requested_date < config.calendar.today() ? config.calendar.today() : request.requested_date,
          time_window: request.time_window,
          delivery_method: request.delivery_method,
          notes: request.notes,
          po_reference: request.po_reference,
        },
        {
          quoteId,
          lines,
          alsoInTransaction: async (trx, orderId) => {
            const accepted = await quotes.setQuoteStatus(trx, quoteId, ['answered'], 'accepted', { order_id: orderId });
            const closed = await quotes.setRequestStatus(trx, request.id, 'open', 'accepted');
            if (!accepted || !closed) throw AppError.conflict('quote_closed', 'This quote request was closed at the same moment');
            await quotes.closeOtherQuotes(trx, request.id, quoteId, 'not_chosen');
            const others = (await quotes.quotesOf([request.id], party, trx)).filter((q) => q.id !== quoteId && q.status === 'not_chosen');
            for (const q of others) {
              await mail(
                trx,
                await ordersRepo.deskEmails(q.merchant_organisation_id, trx),
                `Quote request from ${request.contractor_name} went elsewhere`,
                'Another quote was chosen',
                [`${request.contractor_name} chose another merchant for this request. Thank you for pricing it.`],
                request.id,
              );
            }
          },
        },
      );
      return { order: { id: order.id, status: order.status, reference: order.reference }, quote_request: await get(user, request.id) };
    },

    async withdraw(user: AuthUser, id: number) {
      const request = await quotes.findRequest(partyOf(user), id);
      if (!request) throw AppError.notFound('Quote request');
      const ok = await db.transaction(async (trx) => {
        if (!(await quotes.setRequestStatus(trx, id, 'open', 'withdrawn'))) return false;
        await quotes.closeOtherQuotes(trx, id, null, 'withdrawn');
        return true;
      });
      if (!ok) throw AppError.conflict('quote_closed', 'This quote request is already closed');
      return get(user, id);
    },
  };
}

export type QuotesService = ReturnType<typeof quotesService>;
