import { lockRow } from '../../db/dialect';
import { createHash } from 'node:crypto';
import type { z } from 'zod';
import { can, type Action } from '../../../shared/domain/policy';
import {
  ORDER_STATUS_LABELS,
  ORDER_TRANSITIONS,
  allowedOrderActions,
  orderReference,
  type Order,
  type OrderAction,
  type OrderLineStatus,
  type OrderSite,
  type OrderSummary,
  type OrderDetail,
  type OrderStatus,
  type FollowUpBody,
  type amendOrderBodySchema,
  type confirmOrderBodySchema,
  type orderBookQuerySchema,
  type placeOrderBodySchema,
  type proposalBodySchema,
  type SubstituteFigures,
  type SubstituteOptions,
} from '../../../shared/schemas/order.schema';
import type { BusinessCalendar } from '../../../shared/domain/business-calendar';
import { bookingDateProblem } from '../../../shared/domain/booking-window';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';
import { AppError } from '../../http/app-error';
import { lineAmounts, orderAmounts } from '../../../shared/domain/order-amounts';
import { catalogueRepository, type BranchProductRow } from '../catalogue/catalogue.repository';
import { orderCautions } from '../estimates/cautions';
import { estimatesRepository } from '../estimates/estimates.repository';
import { projectsService } from '../projects/projects.service';
import { runsService } from '../runs/runs.service';
import { slotsService } from '../slots/slots.service';
import { stockRepository } from '../stock/stock.repository';
import { orderBookCache } from './order-book-cache';
import { sendOrderMail, type OrderMailEvent } from './order-mail';
import { ordersRepository, type NewOrderLine, type OrderParty, type OrderRow } from './orders.repository';
import { substituteOptions, substituteTileFigures } from './substitutes';

type PlaceBody = z.output<typeof placeOrderBodySchema>;
type AmendBody = z.output<typeof amendOrderBodySchema>;
type ProposalBody = z.output<typeof proposalBodySchema>;
type ListQuery = z.output<typeof orderBookQuerySchema>;
type ConfirmBody = z.output<typeof confirmOrderBodySchema>;

/** The policy action behind each order step, so a role sees only the steps it may take. */
const ACTION_POLICY: Record<OrderAction, Action> = {
  amend: 'orders:place',
  cancel: 'orders:place',
  accept_changes: 'orders:respond',
  decline_changes: 'orders:respond',
  offer_changes: 'orders:confirm',
  confirm: 'orders:confirm',
  turn_down: 'orders:confirm',
  dispatch: 'slots:book',
  deliver: 'deliveries:record',
};

export const partyOf = (user: AuthUser): OrderParty => ({ kind: user.organisation.kind, organisationId: user.organisation.id });
const actorOf = (user: AuthUser) => ({ userId: user.id, name: user.name, organisationId: user.organisation.id });

/** A weak ETag in the form Express gives a body (length and SHA-1), so conditional reads behave the same. */
const weakEtag = (body: string) => `W/"${Buffer.byteLength(body).toString(16)}-${createHash('sha1').update(body, 'utf8').digest('base64').slice(0, 27)}"`;
/** Stages in which back-ordered packs are owed: once the first part is confirmed. */
const FOLLOW_UP_FROM: readonly OrderStatus[] = ['confirmed', 'on_the_road', 'delivered'];

function invalid(path: string, message: string): AppError {
  return AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path, message }]);
}

/** A delivery day asked for or offered: today up to the end of the booking window. */
function assertNotPast(calendar: BusinessCalendar, date: string, path: string) {
  const problem = bookingDateProblem(calendar, date);
  if (problem) throw invalid(path, problem);
}

/** Why a step cannot be taken on an order in its stage, in words for the person who tried. */
function locked(order: OrderRow, action: OrderAction): AppError {
  return AppError.conflict(
    'order_locked',
    `Order ${orderReference(order.id)} is ${ORDER_STATUS_LABELS[order.status].toLowerCase()}: it can no longer be ${action === 'cancel' ? 'cancelled' : 'changed'} here`,
  );
}

function lineStatus(quantity: number, confirmed: number, backOrder: number, substituted: boolean): OrderLineStatus {
  if (confirmed === quantity) return 'agreed';
  if (confirmed === 0 && backOrder === quantity) return 'back_ordered';
  if (confirmed + backOrder === 0) return substituted ? 'replaced' : 'not_available';
  return 'part_agreed';
}

export function ordersService(deps: Pick<AppDeps, 'db' | 'mailer' | 'logger' | 'config'>) {
  const { db } = deps;
  const orders = ordersRepository(db);
  const catalogue = catalogueRepository(db);
  const estimates = estimatesRepository(db);
  const projects = projectsService(deps);
  const slots = slotsService(deps);
  const runs = runsService(deps);
  const stock = stockRepository(db);

  /** Writes the step's e-mails to the outbox in the step's own transaction, from the order as the step left it. */
  async function notify(trx: Db, event: OrderMailEvent, orderId: number, party: OrderParty, note?: string) {
    const order = (await orders.find(party, orderId, trx))!;
    // One after another: a transaction is one connection, which runs one query at a time.
    const contractor = await orders.contractorEmails(order, trx);
    const desk = await orders.deskEmails(order.merchant_organisation_id, trx);
    const booking = await slots.booking(orderId, trx);
    const slot = booking ? await slots.slot(order.merchant_organisation_id, booking.slot_id, trx) : undefined;
    await sendOrderMail(trx, deps, event, order, { contractor, desk }, note, slot ? { date: slot.date, time_window: slot.time_window, registration: slot.registration } : undefined, party.kind);
  }

  /** Lines priced at the branch now; each product must be one the branch sells. */
  async function priceLines(branchId: number, branchName: string, wanted: { product_id: number; quantity: number }[], path: (i: number) => string, trx: Db = db) {
    const products = await catalogue.branchProducts(
      branchId,
      wanted.map((l) => l.product_id),
      trx,
    );
    const problems = wanted
      .map((l, i) => (products.has(l.product_id) ? null : { path: path(i), message: `is not a product ${branchName} sells` }))
      .filter((p): p is { path: string; message: string } => p !== null);
    if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'Some lines cannot be ordered from this branch', problems);
    return wanted.map((l) => newLine(products.get(l.product_id)!, l.quantity, 'asked'));
  }

  function newLine(p: BranchProductRow, quantity: number, status: OrderLineStatus, unitPrice = p.pack_price): NewOrderLine {
    return {
      product_id: p.id,
      sku: p.sku,
      description: p.name,
      category: p.category,
      unit: p.unit,
      pack_size: p.pack_size,
      pack_weight_kg: p.pack_weight_kg,
      quantity,
      unit_price: unitPrice,
      total: quantity * unitPrice,
      status,
    };
  }

  async function get(user: AuthUser, id: number): Promise<OrderDetail> {
    const party = partyOf(user);
    const order = await orders.find(party, id);
    if (!order) throw AppError.notFound('Order');
    const [lines, proposals, timeline, comments, booking, invoice, followUp, follows] = await Promise.all([
      orders.lines(id),
      orders.proposals(id),
      orders.events(id),
      orders.comments(id),
      slots.booking(id),
      orders.invoiceOf(id),
      orders.followUpOf(id),
      order.follows_order_id ? orders.find(party, order.follows_order_id) : Promise.resolve(undefined),
    ]);
    const backOrdered = lines.reduce((sum, l) => sum + l.back_order_quantity, 0);
    const pricedLines = lines.map((l) => ({ ...l, ...lineAmounts(l, order.status) }));
    const slot = booking ? await slots.slot(order.merchant_organisation_id, booking.slot_id) : undefined;
    const detail: Order = {
      ...summary(order),
      estimate_id: party.kind === 'contractor' ? order.estimate_id : null,
      quote_id: order.quote_id,
      notes: order.notes,
      site: order.site,
      lines,
      proposals,
      timeline,
      allowed_actions: allowedOrderActions(order.status, party.kind).filter((a) => can(user.role, ACTION_POLICY[a])),
      cautions: orderCautions(order.delivery_method, order.site),
      confirmed_at: order.confirmed_at,
      cancelled_at: order.cancelled_at,
    };
    // Steps beyond the stage changes: booking the lorry once confirmed, invoicing once goods are promised.
    if (party.kind === 'merchant') {
      if (order.status === 'confirmed' && can(user.role, 'slots:book')) detail.allowed_actions.push('book_slot');
      if (['confirmed', 'on_the_road', 'delivered'].includes(order.status) && !invoice && can(user.role, 'invoices:issue')) detail.allowed_actions.push('issue_invoice');
      if (FOLLOW_UP_FROM.includes(order.status) && backOrdered > 0 && !followUp && can(user.role, 'orders:confirm')) detail.allowed_actions.push('start_follow_up');
    }
    const link = (o: { id: number; status: OrderStatus }) => ({ id: o.id, reference: orderReference(o.id), status: o.status, status_label: ORDER_STATUS_LABELS[o.status] });
    return {
      ...detail,
      lines: pricedLines,
      amounts: orderAmounts(pricedLines),
      slot:
        booking && slot
          ? {
              slot_id: slot.id,
              date: slot.date,
              time_window: slot.time_window,
              lorry: { id: slot.lorry_id, registration: slot.registration, has_crane: slot.has_crane },
              driver: slot.driver_user_id ? { id: slot.driver_user_id, name: slot.driver_name ?? '' } : null,
              weight_kg: booking.weight_kg,
              pallets: booking.pallets,
              booked_at: booking.booked_at,
            }
          : null,
      delivery:
        booking?.delivered_at
          ? {
              delivered_at: booking.delivered_at,
              received_by: booking.received_by ?? '',
              notes: booking.delivery_notes ?? '',
              recorded_by: booking.recorded_by ? { id: booking.recorded_by, name: booking.recorded_by_name ?? '' } : null,
            }
          : null,
      comments: comments.map(({ organisationKind: _kind, ...c }) => c),
      invoice,
      follows: follows ? link(follows) : null,
      followed_by: followUp ? link(followUp) : null,
      back_ordered_packs: backOrdered,
    };
  }

  function summary(o: OrderRow): OrderSummary {
    return {
      id: o.id,
      reference: orderReference(o.id),
      status: o.status,
      status_label: ORDER_STATUS_LABELS[o.status],
      revision: o.revision,
      contractor: { id: o.contractor_organisation_id, name: o.contractor_name },
      branch: { id: o.branch_id, name: o.branch_name, town: o.branch_town, merchant: { id: o.merchant_organisation_id, name: o.merchant_name } },
      project: { id: o.project_id, name: o.site_name },
      requested_date: o.requested_date,
      time_window: o.time_window,
      delivery_method: o.delivery_method,
      po_reference: o.po_reference,
      subtotal: o.subtotal,
      line_count: o.line_count,
      placed_at: o.placed_at,
      updated_at: o.updated_at,
    };
  }

  const bookBody = (f: ListQuery, count: { total: number; capped: boolean }, summaries: OrderSummary[]) =>
    JSON.stringify({ orders: summaries, total: count.total, total_capped: count.capped, page: f.page, page_size: f.page_size });
  const book = orderBookCache({
    version: orders.bookVersion,
    count: orders.count,
    page: async (party: OrderParty, f: ListQuery, count: { total: number; capped: boolean }) => {
      const body = bookBody(f, count, (await orders.page(party, f)).map(summary));
      return { body, etag: weakEtag(body) };
    },
  });

  /** Loads a contractor's order inside a transaction and checks the step is allowed at this revision. */
  async function forStep(trx: Db, user: AuthUser, id: number, action: OrderAction, revision?: number) {
    const order = await orders.find(partyOf(user), id, trx);
    if (!order) throw AppError.notFound('Order');
    const t = ORDER_TRANSITIONS[action];
    if (!(t.from as readonly string[]).includes(order.status)) throw locked(order, action);
    if (revision !== undefined && revision !== order.revision) {
      throw AppError.conflict('order_changed', `Order ${orderReference(order.id)} has changed since you opened it; reload it and try again`);
    }
    return order;
  }

  async function siteSnapshot(user: AuthUser, projectId: number): Promise<OrderSite> {
    const p = await projects.get(user, projectId);
    return {
      name: p.name,
      site_address: p.site_address,
      site_postcode: p.site_postcode,
      contact_name: p.contact_name,
      contact_phone: p.contact_phone,
      vehicle_access: p.vehicle_access,
      crane_lift: p.crane_lift,
      overhead_lines: p.overhead_lines,
      set_down_place: p.set_down_place,
      access_notes: p.access_notes,
    };
  }

  function assertCraneAllowed(method: 'ground' | 'roof', site: OrderSite, path: string) {
    if (method === 'roof' && site.crane_lift === 'not_allowed') {
      throw invalid(path, "the site's access notes say the lorry crane cannot lift there: choose ground, or change the site's access notes");
    }
  }

  return {
    get,
    summary,
    newLine,

    /**
     * A page of the order book as JSON text ({orders, total, total_capped, page, page_size}) with its
     * ETag: the book is read far more than it changes, so each page is read, serialised and tagged
     * once per change (see order-book-cache) rather than once per reader.
     */
    async listPage(user: AuthUser, query: ListQuery): Promise<{ body: string; etag?: string }> {
      const { page, total, capped } = await book.read(partyOf(user), query);
      return page ?? { body: bookBody(query, { total, capped }, []) };
    },

    /**
     * Sends an order to one branch, from an estimate: its lines as they are, or lines adjusted before
     * sending. Prices are the branch's prices today; the site is copied as it stands.
     */
    async place(
      user: AuthUser,
      body: PlaceBody,
      from: { quoteId?: number; lines?: NewOrderLine[]; /** Runs in the order's own transaction. */ alsoInTransaction?: (trx: Db, orderId: number) => Promise<void> } = {},
    ) {
      const estimate = await estimates.find(user.organisation.id, body.estimate_id);
      if (!estimate) throw invalid('estimate_id', 'is not an estimate of yours');
      await projects.requireOpen(user, estimate.project_id);
      const branch = (await catalogue.branchesByIds([body.branch_id])).get(body.branch_id);
      if (!branch) throw invalid('branch_id', 'is not a merchant branch');
      assertNotPast(deps.config.calendar, body.requested_date, 'requested_date');
      const site = await siteSnapshot(user, estimate.project_id);
      assertCraneAllowed(body.delivery_method, site, 'delivery_method');

      let lines: NewOrderLine[];
      if (from.lines) {
        lines = from.lines;
      } else if (body.lines) {
        lines = await priceLines(branch.id, branch.name, body.lines, (i) => `lines.${i}.product_id`);
      } else {
        const estimateLines = await estimates.lines(estimate.id);
        const withProducts = estimateLines.filter((l) => l.product_id !== null);
        if (withProducts.length === 0) throw invalid('lines', 'this estimate has no merchant products: give the lines to order, or ask branches for a quote');
        const sold = await catalogue.branchProducts(
          branch.id,
          withProducts.map((l) => l.product_id!),
        );
        const missing = withProducts.filter((l) => !sold.has(l.product_id!));
        if (missing.length > 0) {
          throw AppError.unprocessable(
            'validation_failed',
            `${branch.name} does not sell every product of this estimate`,
            missing.map((l) => ({ path: 'branch_id', message: `${branch.name} does not sell ${l.sku} (${l.description}): adjust the lines or ask for a quote` })),
          );
        }
        lines = withProducts.map((l) => newLine(sold.get(l.product_id!)!, l.packs, 'asked'));
      }
      const subtotal = lines.reduce((s, l) => s + l.total, 0);
      const id = await db.transaction(async (trx) => {
        const orderId = await orders.insertOrder(
          trx,
          {
            contractor_organisation_id: user.organisation.id,
            merchant_organisation_id: branch.merchant.id,
            branch_id: branch.id,
            project_id: estimate.project_id,
            estimate_id: estimate.id,
            quote_id: from.quoteId ?? null,
            status: 'sent',
            requested_date: body.requested_date,
            time_window: body.time_window ?? null,
            delivery_method: body.delivery_method,
            po_reference: body.po_reference ?? '',
            notes: body.notes ?? '',
            site_name: site.name,
            site,
            subtotal,
            placed_by: user.id,
            placed_at: nowIso(),
          },
          lines,
        );
        await orders.insertEvent(trx, orderId, {
          kind: 'placed',
          actor: actorOf(user),
          summary: `Sent to ${branch.name}: ${lines.length} lines for ${body.requested_date}${body.time_window ? ` ${body.time_window}` : ''}`,
          data: { lines: lines.length, subtotal, ...(from.quoteId ? { quote_id: from.quoteId } : {}) },
        });
        if (from.alsoInTransaction) await from.alsoInTransaction(trx, orderId);
        await notify(trx, 'placed', orderId, partyOf(user));
        return orderId;
      });
      return get(user, id);
    },

    /** Changes what was asked for until the merchant confirms; any offer the desk made on the old order lapses. */
    async amend(user: AuthUser, id: number, body: AmendBody) {
      await db.transaction(async (trx) => {
        const order = await forStep(trx, user, id, 'amend', body.revision);
        const method = body.delivery_method ?? order.delivery_method;
        if (body.requested_date) assertNotPast(deps.config.calendar, body.requested_date, 'requested_date');
        assertCraneAllowed(method, order.site, 'delivery_method');
        const changes: string[] = [];
        const values: Record<string, unknown> = { status: ORDER_TRANSITIONS.amend.to };
        for (const key of ['requested_date', 'time_window', 'delivery_method', 'notes', 'po_reference'] as const) {
          if (body[key] !== undefined && body[key] !== order[key]) {
            values[key] = body[key];
            changes.push(key);
          }
        }
        if (body.lines) {
          const lines = await priceLines(order.branch_id, order.branch_name, body.lines, (i) => `lines.${i}.product_id`, trx);
          await orders.replaceLines(trx, id, lines);
          values.subtotal = lines.reduce((s, l) => s + l.total, 0);
          changes.push('lines');
        }
        if (!(await orders.updateIf(trx, id, { statuses: ORDER_TRANSITIONS.amend.from, revision: body.revision }, values, true))) {
          throw AppError.conflict('order_changed', 'The order changed while you were editing it; reload it and try again');
        }
        await orders.supersedeOpenProposals(trx, id);
        await orders.insertEvent(trx, id, {
          kind: 'amended',
          actor: actorOf(user),
          summary: changes.length > 0 ? `Changed ${changes.join(', ').replace(/_/g, ' ')}` : 'Sent again unchanged',
          data: { changes },
        });
        await notify(trx, 'amended', id, partyOf(user));
      });
      return get(user, id);
    },

    async cancel(user: AuthUser, id: number, reason?: string) {
      await db.transaction(async (trx) => {
        const order = await forStep(trx, user, id, 'cancel');
        const now = nowIso();
        if (!(await orders.updateIf(trx, id, { statuses: ORDER_TRANSITIONS.cancel.from, revision: order.revision }, { status: 'cancelled', cancelled_at: now }, true))) {
          throw AppError.conflict('order_changed', 'The order changed at the same moment; reload it and try again');
        }
        await orders.supersedeOpenProposals(trx, id);
        await orders.insertEvent(trx, id, { kind: 'cancelled', actor: actorOf(user), summary: reason ? `Cancelled: ${reason}` : 'Cancelled', data: reason ? { reason } : {} });
        await notify(trx, 'cancelled', id, partyOf(user), reason);
      });
      return get(user, id);
    },

    /**
     * The desk's answer with changes: per line what it sends now, what it back-orders and what it
     * offers instead, and a delivery day or slot. The contractor accepts or declines it as a whole.
     */
    async offerChanges(user: AuthUser, id: number, body: ProposalBody) {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      const proposalId = await db.transaction(async (trx) => {
        const order = await orders.find(partyOf(user), id, trx);
        if (!order) throw AppError.notFound('Order');
        const t = ORDER_TRANSITIONS.offer_changes;
        if (!(t.from as readonly string[]).includes(order.status)) throw locked(order, 'offer_changes');
        if (body.revision !== order.revision) throw AppError.conflict('order_changed', 'The contractor changed the order; reload it before answering');
        if (body.proposed_date) assertNotPast(deps.config.calendar, body.proposed_date, 'proposed_date');

        const lines = await orders.lines(id, trx);
        const subIds = (body.lines ?? []).flatMap((l) => (l.substitute ? [l.substitute.product_id] : []));
        const subs = await catalogue.branchProducts(order.branch_id, subIds, trx);
        const problems: { path: string; message: string }[] = [];
        const seen = new Set<number>();
        const proposalLines = (body.lines ?? []).map((pl, i) => {
          const line = lines.find((l) => l.id === pl.line_id);
          if (!line || line.status === 'substitute') problems.push({ path: `lines.${i}.line_id`, message: 'is not a line of this order' });
          else if (seen.has(line.id)) problems.push({ path: `lines.${i}.line_id`, message: 'is answered twice' });
          else {
            seen.add(line.id);
            if (pl.confirmed_quantity + pl.back_order_quantity > line.quantity) {
              problems.push({ path: `lines.${i}.confirmed_quantity`, message: `confirmed and back-ordered packs must add up to at most the ${line.quantity} asked for` });
            }
            if (pl.substitute && pl.confirmed_quantity + pl.back_order_quantity === line.quantity) {
              problems.push({ path: `lines.${i}.substitute`, message: 'the whole quantity is already confirmed or back-ordered: there is nothing to substitute' });
            }
          }
          const sub = pl.substitute ? subs.get(pl.substitute.product_id) : undefined;
          if (pl.substitute && !sub) problems.push({ path: `lines.${i}.substitute.product_id`, message: `is not a product ${order.branch_name} sells` });
          return {
            order_line_id: pl.line_id,
            confirmed_quantity: pl.confirmed_quantity,
            back_order_quantity: pl.back_order_quantity,
            substitute_product_id: pl.substitute?.product_id ?? null,
            substitute_quantity: pl.substitute?.quantity ?? null,
            substitute_unit_price: pl.substitute ? (pl.substitute.unit_price ?? sub?.pack_price ?? 0) : null,
            substitute_figures: null as SubstituteFigures | null,
            note: pl.note ?? '',
          };
        });
        if (body.proposed_slot_id !== undefined) {
          const slot = await slots.slot(user.organisation.id, body.proposed_slot_id, trx);
          if (!slot || slot.branch_id !== order.branch_id) problems.push({ path: 'proposed_slot_id', message: `is not a delivery slot of ${order.branch_name}` });
        }
        // A substitute tile is worked out on the order's own roof by the engine before it can be offered.
        for (const [i, pl] of proposalLines.entries()) {
          const line = lines.find((l) => l.id === pl.order_line_id);
          const sub = pl.substitute_product_id ? subs.get(pl.substitute_product_id) : undefined;
          if (!line || !sub || line.category !== 'tile' || sub.category !== 'tile') continue;
          if (pl.confirmed_quantity + pl.back_order_quantity > 0) {
            problems.push({ path: `lines.${i}.substitute`, message: `another tile cannot be laid beside ${line.sku} on the same roof: offer ${sub.sku} for the whole line (none now, none to follow)` });
            continue;
          }
          const worked = await substituteTileFigures(trx, order, lines, sub, pl.substitute_unit_price ?? sub.pack_price);
          if (!worked.ok) {
            problems.push({ path: `lines.${i}.substitute.product_id`, message: worked.reason });
            continue;
          }
          const refused = worked.figures.refused_faces;
          if (refused.length > 0) {
            for (const r of refused) problems.push({ path: `lines.${i}.substitute.product_id`, message: `${sub.sku} does not suit ${r.message}` });
            continue;
          }
          if (pl.substitute_quantity !== worked.packs) {
            problems.push({ path: `lines.${i}.substitute.quantity`, message: `the engine counts ${worked.packs} packs of ${sub.sku} for this roof (${pl.substitute_quantity} given)` });
            continue;
          }
          pl.substitute_figures = worked.figures;
        }
        if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'Some lines of the answer are not valid', problems);

        const pid = await orders.insertProposal(
          trx,
          {
            order_id: id,
            order_revision: order.revision,
            message: body.message ?? '',
            proposed_date: body.proposed_date ?? null,
            proposed_time_window: body.proposed_time_window ?? null,
            proposed_slot_id: body.proposed_slot_id ?? null,
            proposed_by: user.id,
          },
          proposalLines,
        );
        if (!(await orders.updateIf(trx, id, { statuses: t.from, revision: order.revision }, { status: t.to }, false))) {
          throw AppError.conflict('order_changed', 'The order changed at the same moment; reload it and try again');
        }
        const parts = [
          proposalLines.length > 0 ? `${proposalLines.length} ${proposalLines.length === 1 ? 'line' : 'lines'}` : null,
          body.proposed_date ? `delivery ${body.proposed_date}${body.proposed_time_window ? ` ${body.proposed_time_window}` : ''}` : null,
          body.proposed_slot_id ? 'a delivery slot' : null,
        ].filter(Boolean);
        await orders.insertEvent(trx, id, { kind: 'changes_offered', actor: actorOf(user), summary: `Offered changes: ${parts.join(', ')}`, data: { proposal_id: pid } });
        await notify(trx, 'changes_offered', id, partyOf(user), body.message);
        return pid;
      });
      return { proposal_id: proposalId, order: await get(user, id) };
    },

    /** Accepting makes the desk's offer the order: agreed and back-ordered packs, substitutes as new lines, the new day. */
    async acceptChanges(user: AuthUser, id: number, proposalId: number, note?: string) {
      await db.transaction(async (trx) => {
        const order = await forStep(trx, user, id, 'accept_changes');
        const proposal = (await orders.proposals(id, trx)).find((p) => p.id === proposalId);
        if (!proposal) throw AppError.notFound('Proposal');
        if (proposal.status !== 'open' || proposal.order_revision !== order.revision) {
          throw AppError.conflict('proposal_closed', 'This offer is no longer open');
        }
        const lines = await orders.lines(id, trx);
        const answered = new Map(proposal.lines.map((pl) => [pl.order_line_id, pl]));
        const substitutes: NewOrderLine[] = [];
        const subProducts = await catalogue.branchProducts(
          order.branch_id,
          proposal.lines.flatMap((pl) => (pl.substitute ? [pl.substitute.product_id] : [])),
          trx,
        );
        // A substitute tile changes what else the roof takes (battens, fixings, ridge…): the engine's
        // difference for each of those items moves the order's line for it, or adds one.
        const accessoryDelta = new Map<number, number>();
        const accessoryNew: { product_id: number; packs: number; unit_price: number }[] = [];
        for (const pl of proposal.lines) {
          for (const row of pl.substitute?.figures?.rows ?? []) {
            if (row.role === 'tile' || !row.changes) continue;
            const productId = row.before?.product_id ?? row.after?.product_id;
            if (!productId) continue;
            const delta = (row.after?.packs ?? 0) - (row.before?.packs ?? 0);
            const onOrder = lines.find((l) => l.product_id === productId && l.status !== 'substitute' && !answered.has(l.id));
            if (onOrder) accessoryDelta.set(onOrder.id, (accessoryDelta.get(onOrder.id) ?? 0) + delta);
            else if (delta > 0 && row.after?.product_id) accessoryNew.push({ product_id: row.after.product_id, packs: delta, unit_price: row.after.unit_price ?? 0 });
          }
        }
        for (const line of lines) {
          if (line.status === 'substitute') continue;
          const pl = answered.get(line.id);
          const wanted = line.quantity + (accessoryDelta.get(line.id) ?? 0);
          // An item the substitute tile no longer needs (clips for a tile laid without them) stays on the order as replaced.
          const quantity = wanted > 0 ? wanted : line.quantity;
          const confirmed = pl ? pl.confirmed_quantity : wanted > 0 ? quantity : 0;
          const backOrder = pl ? pl.back_order_quantity : 0;
          await orders.updateLine(trx, line.id, {
            ...(quantity !== line.quantity ? { quantity } : {}),
            confirmed_quantity: confirmed,
            back_order_quantity: backOrder,
            total: line.unit_price * (confirmed + backOrder),
            status: lineStatus(quantity, confirmed, backOrder, Boolean(pl?.substitute) || wanted <= 0),
          });
          if (pl?.substitute) {
            const product = subProducts.get(pl.substitute.product_id);
            if (!product) throw AppError.conflict('substitute_unavailable', `${pl.substitute.sku} is no longer sold by ${order.branch_name}; ask the merchant to answer again`);
            substitutes.push({
              ...newLine(product, pl.substitute.quantity, 'substitute', pl.substitute.unit_price),
              confirmed_quantity: pl.substitute.quantity,
              replaces_line_id: line.id,
            });
          }
        }
        const added = await catalogue.branchProducts(
          order.branch_id,
          accessoryNew.map((a) => a.product_id),
          trx,
        );
        for (const a of accessoryNew) {
          const product = added.get(a.product_id);
          if (product) substitutes.push({ ...newLine(product, a.packs, 'agreed', a.unit_price), confirmed_quantity: a.packs });
        }
        await orders.insertLines(trx, id, substitutes, lines.length + 1);
        const subtotal = (await orders.lines(id, trx)).reduce((s, l) => s + l.total, 0);
        await orders.answerProposal(trx, proposalId, 'accepted', user.id);
        const t = ORDER_TRANSITIONS.accept_changes;
        const values: Record<string, unknown> = { status: t.to, subtotal };
        if (proposal.proposed_date) values.requested_date = proposal.proposed_date;
        if (proposal.proposed_time_window) values.time_window = proposal.proposed_time_window;
        if (!(await orders.updateIf(trx, id, { statuses: t.from, revision: order.revision }, values, true))) {
          throw AppError.conflict('order_changed', 'The order changed at the same moment; reload it and try again');
        }
        await orders.insertEvent(trx, id, {
          kind: 'changes_accepted',
          actor: actorOf(user),
          summary: note ? `Accepted the offered changes: ${note}` : 'Accepted the offered changes',
          data: { proposal_id: proposalId, substitutes: substitutes.length },
        });
        await notify(trx, 'changes_accepted', id, partyOf(user), note);
      });
      return get(user, id);
    },

    /** Declining leaves the order as it was sent; the desk answers again (confirms, offers again or turns it down). */
    async declineChanges(user: AuthUser, id: number, proposalId: number, note?: string) {
      await db.transaction(async (trx) => {
        const order = await forStep(trx, user, id, 'decline_changes');
        const proposal = (await orders.proposals(id, trx)).find((p) => p.id === proposalId);
        if (!proposal) throw AppError.notFound('Proposal');
        if (!(await orders.answerProposal(trx, proposalId, 'declined', user.id))) throw AppError.conflict('proposal_closed', 'This offer is no longer open');
        const t = ORDER_TRANSITIONS.decline_changes;
        if (!(await orders.updateIf(trx, id, { statuses: t.from, revision: order.revision }, { status: t.to }, false))) {
          throw AppError.conflict('order_changed', 'The order changed at the same moment; reload it and try again');
        }
        await orders.insertEvent(trx, id, {
          kind: 'changes_declined',
          actor: actorOf(user),
          summary: note ? `Declined the offered changes: ${note}` : 'Declined the offered changes',
          data: { proposal_id: proposalId },
        });
        await notify(trx, 'changes_declined', id, partyOf(user), note);
      });
      return get(user, id);
    },

    /**
     * The desk confirms: each line's packs to send now are held from the branch's stock in the same
     * transaction (the rest is back-ordered), and the order is booked into a slot when one is given.
     * If any line lacks the stock, nothing is held and the answer is 409 insufficient_stock naming
     * each SKU with the packs free and the packs asked for.
     */
    async confirm(user: AuthUser, id: number, body: ConfirmBody) {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      const t = ORDER_TRANSITIONS.confirm;
      await db.transaction(async (trx) => {
        const order = await orders.find(partyOf(user), id, trx);
        if (!order) throw AppError.notFound('Order');
        if (!(t.from as readonly string[]).includes(order.status)) throw locked(order, 'confirm');
        const lines = await orders.lines(id, trx);
        const wanted = new Map((body.lines ?? []).map((l) => [l.line_id, l.quantity]));
        const problems: { path: string; message: string }[] = [];
        (body.lines ?? []).forEach((l, i) => {
          if (!lines.some((x) => x.id === l.line_id)) problems.push({ path: `lines.${i}.line_id`, message: 'is not a line of this order' });
        });
        const plan = lines.map((line) => {
          // What is open to send: the agreed packs after accepted changes, the packs asked for otherwise.
          const open = line.confirmed_quantity ?? line.quantity;
          const send = wanted.get(line.id) ?? open;
          return { line, open, send, back: line.back_order_quantity + Math.max(0, open - send) };
        });
        plan.forEach((p) => {
          if (p.send > p.open) {
            const i = (body.lines ?? []).findIndex((l) => l.line_id === p.line.id);
            problems.push({ path: `lines.${i}.quantity`, message: `at most the ${p.open} packs ${order.status === 'agreed' ? 'agreed' : 'asked for'}` });
          }
        });
        if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'Some lines cannot be confirmed like this', problems);

        const byProduct = new Map<number, { sku: string; line_id: number; requested: number }>();
        for (const p of plan) {
          if (p.send === 0) continue;
          const prev = byProduct.get(p.line.product_id);
          byProduct.set(p.line.product_id, { sku: p.line.sku, line_id: prev?.line_id ?? p.line.id, requested: (prev?.requested ?? 0) + p.send });
        }
        const shortfall = async () => {
          const levels = await stock.levels(trx, order.branch_id, [...byProduct.keys()]);
          return [...byProduct.entries()]
            .map(([productId, w]) => ({ ...w, available: Math.max(0, (levels.get(productId)?.on_hand ?? 0) - (levels.get(productId)?.reserved ?? 0)) }))
            .filter((w) => w.available < w.requested)
            .map((w) => ({ sku: w.sku, line_id: w.line_id, available: w.available, requested: w.requested, message: `${w.sku}: ${w.available} packs free at ${order.branch_name}, ${w.requested} asked` }));
        };
        const insufficient = (details: Awaited<ReturnType<typeof shortfall>>) =>
          AppError.conflict('insufficient_stock', `Not enough stock at ${order.branch_name} to confirm ${orderReference(order.id)}: confirm part and back-order the rest, or offer a substitute`, details);
        const short = await shortfall();
        if (short.length > 0) throw insufficient(short);
        for (const [productId, w] of byProduct) {
          if (!(await stock.reserve(trx, order.branch_id, productId, w.requested))) throw insufficient(await shortfall());
        }
        const substituted = new Set(lines.filter((l) => l.replaces_line_id !== null).map((l) => l.replaces_line_id));
        for (const p of plan) {
          const status: OrderLineStatus = p.line.status === 'substitute' ? 'substitute' : lineStatus(p.line.quantity, p.send, p.back, substituted.has(p.line.id));
          await orders.setConfirmed(trx, p.line.id, { confirmed_quantity: p.send, back_order_quantity: p.back, reserved_quantity: p.send, total: p.line.unit_price * (p.send + p.back), status });
        }
        const after = await orders.lines(id, trx);
        const subtotal = after.reduce((sum, l) => sum + l.total, 0);
        if (!(await orders.updateIf(trx, id, { statuses: t.from, revision: order.revision }, { status: t.to, confirmed_at: nowIso(), subtotal }, true))) {
          throw AppError.conflict('order_changed', 'The order changed at the same moment; reload it and try again');
        }
        await orders.supersedeOpenProposals(trx, id);
        let slotNote = '';
        if (body.slot_id) {
          const slot = await slots.book(trx, user, order, body.slot_id, await slots.loadOf(trx, order, after));
          slotNote = `; delivery booked ${slot.date} ${slot.time_window} on ${slot.registration}`;
        }
        const backOrdered = plan.reduce((sum, p) => sum + (p.back - p.line.back_order_quantity), 0);
        await orders.insertEvent(trx, id, {
          kind: 'confirmed',
          actor: actorOf(user),
          summary: `Confirmed ${plan.filter((p) => p.send > 0).length} lines from stock${backOrdered > 0 ? `, ${backOrdered} packs back-ordered` : ''}${slotNote}`,
          data: { reserved: Object.fromEntries(plan.map((p) => [p.line.sku, p.send])), back_ordered: backOrdered, ...(body.slot_id ? { slot_id: body.slot_id } : {}) },
        });
        await notify(trx, 'confirmed', id, partyOf(user));
      });
      return get(user, id);
    },

    /** The desk cannot supply the order: it is closed with the reason, and the contractor can order elsewhere. */
    async turnDown(user: AuthUser, id: number, reason: string) {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      const t = ORDER_TRANSITIONS.turn_down;
      await db.transaction(async (trx) => {
        const order = await orders.find(partyOf(user), id, trx);
        if (!order) throw AppError.notFound('Order');
        if (!(t.from as readonly string[]).includes(order.status)) throw locked(order, 'turn_down');
        if (!(await orders.updateIf(trx, id, { statuses: t.from, revision: order.revision }, { status: t.to }, true))) {
          throw AppError.conflict('order_changed', 'The order changed at the same moment; reload it and try again');
        }
        await orders.supersedeOpenProposals(trx, id);
        await orders.insertEvent(trx, id, { kind: 'turned_down', actor: actorOf(user), summary: `Turned down: ${reason}`, data: { reason } });
        await notify(trx, 'turned_down', id, partyOf(user), reason);
      });
      return get(user, id);
    },

    /** Books a confirmed order into a slot, or moves it to another; the contractor is told the day. */
    async bookSlot(user: AuthUser, id: number, slotId: number) {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      await db.transaction(async (trx) => {
        const order = await orders.find(partyOf(user), id, trx);
        if (!order) throw AppError.notFound('Order');
        if (order.status !== 'confirmed') throw AppError.conflict('order_not_confirmed', `Only a confirmed order can be booked onto a lorry; ${orderReference(id)} is ${ORDER_STATUS_LABELS[order.status].toLowerCase()}`);
        const slot = await slots.book(trx, user, order, slotId, await slots.loadOf(trx, order, await orders.lines(id, trx)));
        await orders.insertEvent(trx, id, { kind: 'slot_booked', actor: actorOf(user), summary: `Delivery booked ${slot.date} ${slot.time_window} on ${slot.registration}`, data: { slot_id: slot.id } });
        await notify(trx, 'slot_booked', id, partyOf(user));
      });
      return get(user, id);
    },

    async unbookSlot(user: AuthUser, id: number) {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      await db.transaction(async (trx) => {
        const order = await orders.find(partyOf(user), id, trx);
        if (!order) throw AppError.notFound('Order');
        if (order.status !== 'confirmed') throw AppError.conflict('order_not_confirmed', 'The lorry has left: the booking can no longer change');
        if (!(await slots.unbook(trx, id))) throw AppError.conflict('not_booked', `${orderReference(id)} is not booked into a slot`);
        await orders.insertEvent(trx, id, { kind: 'slot_released', actor: actorOf(user), summary: 'Delivery slot released', data: {} });
      });
      return get(user, id);
    },

    /** The lorry leaves the yard: the order must be booked into a slot with a driver. */
    async dispatch(user: AuthUser, id: number) {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      const t = ORDER_TRANSITIONS.dispatch;
      await db.transaction(async (trx) => {
        const order = await orders.find(partyOf(user), id, trx);
        if (!order) throw AppError.notFound('Order');
        if (!(t.from as readonly string[]).includes(order.status)) throw locked(order, 'dispatch');
        const booking = await slots.booking(id, trx);
        if (!booking) throw AppError.conflict('not_booked', `Book ${orderReference(id)} into a delivery slot before it goes out`);
        const slot = (await slots.slot(user.organisation.id, booking.slot_id, trx))!;
        if (!slot.driver_user_id) throw AppError.conflict('no_driver', `Assign a driver to ${slot.registration} on ${slot.date} ${slot.time_window} first`);
        // The same rules as the run's send-out: its day, every pallet of this order ticked loaded.
        await runs.assertOrderMayLeave(user, id, trx);
        if (!(await orders.updateIf(trx, id, { statuses: t.from }, { status: t.to }, false))) throw AppError.conflict('order_changed', 'The order changed at the same moment; reload it and try again');
        await orders.insertEvent(trx, id, { kind: 'dispatched', actor: actorOf(user), summary: `Out for delivery on ${slot.registration} with ${slot.driver_name}`, data: { slot_id: slot.id } });
        await notify(trx, 'dispatched', id, partyOf(user));
      });
      return get(user, id);
    },

    /**
     * Starts the delivery of an order's back-ordered packs: a new order to the same branch and site,
     * one line per back-ordered line at the price agreed on the first order, waiting for the desk to
     * confirm it against stock (it is already agreed with the contractor, so it arrives as agreed).
     * Both orders name each other on their timelines; the first keeps its back-order figures as the
     * record of what was promised. One follow-up per order.
     */
    async startFollowUp(user: AuthUser, id: number, body: FollowUpBody) {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      assertNotPast(deps.config.calendar, body.requested_date, 'requested_date');
      const followUpId = await db.transaction(async (trx) => {
        await lockRow(trx, 'orders', id);
        const order = await orders.find(partyOf(user), id, trx);
        if (!order) throw AppError.notFound('Order');
        if (!FOLLOW_UP_FROM.includes(order.status)) {
          throw AppError.conflict('order_not_confirmed', `${orderReference(id)} is ${ORDER_STATUS_LABELS[order.status].toLowerCase()}: back-ordered packs follow once the order is confirmed`);
        }
        const existing = await orders.followUpOf(id, trx);
        if (existing) throw AppError.conflict('follow_up_exists', `The back-ordered packs of ${orderReference(id)} already follow as ${orderReference(existing.id)}`, [{ message: `already follows as ${orderReference(existing.id)}`, order_id: existing.id, reference: orderReference(existing.id) }]);
        const owed = (await orders.lines(id, trx)).filter((l) => l.back_order_quantity > 0);
        if (owed.length === 0) throw AppError.conflict('nothing_back_ordered', `${orderReference(id)} has no back-ordered packs to send`);
        const lines: NewOrderLine[] = owed.map((l) => ({
          product_id: l.product_id,
          sku: l.sku,
          description: l.description,
          category: l.category,
          unit: l.unit,
          pack_size: l.pack_size,
          pack_weight_kg: l.pack_weight_kg,
          quantity: l.back_order_quantity,
          unit_price: l.unit_price,
          total: l.unit_price * l.back_order_quantity,
          status: 'asked',
        }));
        const packs = lines.reduce((sum, l) => sum + l.quantity, 0);
        const subtotal = lines.reduce((sum, l) => sum + l.total, 0);
        const newId = await orders.insertOrder(
          trx,
          {
            contractor_organisation_id: order.contractor_organisation_id,
            merchant_organisation_id: order.merchant_organisation_id,
            branch_id: order.branch_id,
            project_id: order.project_id,
            estimate_id: order.estimate_id,
            quote_id: null,
            follows_order_id: order.id,
            status: 'agreed',
            requested_date: body.requested_date,
            time_window: body.time_window !== undefined ? body.time_window : order.time_window,
            delivery_method: order.delivery_method,
            po_reference: order.po_reference,
            notes: body.note ?? '',
            site_name: order.site_name,
            site: order.site,
            subtotal,
            placed_by: order.placed_by,
            placed_at: nowIso(),
          },
          lines,
        );
        const wanted = `${body.requested_date}${body.time_window ? ` ${body.time_window}` : ''}`;
        await orders.insertEvent(trx, newId, {
          kind: 'follow_up_started',
          actor: actorOf(user),
          summary: `Carries the back-ordered packs of ${orderReference(order.id)}: ${lines.length} lines, ${packs} packs, wanted ${wanted}`,
          data: { follows_order_id: order.id, lines: lines.length, packs, subtotal },
        });
        await orders.insertEvent(trx, order.id, {
          kind: 'follow_up_started',
          actor: actorOf(user),
          summary: `Back-ordered packs (${packs}) follow as ${orderReference(newId)}, wanted ${wanted}`,
          data: { follow_up_order_id: newId, packs },
        });
        await notify(trx, 'follow_up_started', newId, partyOf(user), body.note);
        return newId;
      });
      return get(user, followUpId);
    },

    async comments(user: AuthUser, id: number) {
      if (!(await orders.find(partyOf(user), id))) throw AppError.notFound('Order');
      return { comments: (await orders.comments(id)).map(({ organisationKind: _kind, ...c }) => c) };
    },

    /** A comment between the two sides; it goes on the timeline too. */
    async comment(user: AuthUser, id: number, body: string) {
      const commentId = await db.transaction(async (trx) => {
        const order = await orders.find(partyOf(user), id, trx);
        if (!order) throw AppError.notFound('Order');
        const cid = await orders.insertComment(trx, id, { userId: user.id, name: user.name, organisationId: user.organisation.id, body });
        await orders.insertEvent(trx, id, { kind: 'commented', actor: actorOf(user), summary: `Comment: ${body.length > 120 ? `${body.slice(0, 117)}…` : body}`, data: { comment_id: cid } });
        await notify(trx, 'commented', id, partyOf(user), body);
        return cid;
      });
      const c = (await orders.comments(id)).find((x) => x.id === commentId)!;
      const { organisationKind: _kind, ...comment } = c;
      return comment;
    },

    linesOf: (orderId: number) => orders.lines(orderId),

    /** What the desk may offer instead of one line, each with its quantity and, for a tile, the engine's figures. */
    async substitutes(user: AuthUser, id: number, lineId: number): Promise<SubstituteOptions> {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      const order = await orders.find(partyOf(user), id);
      if (!order) throw AppError.notFound('Order');
      const lines = await orders.lines(id);
      const line = lines.find((l) => l.id === lineId && l.status !== 'substitute');
      if (!line) throw AppError.notFound('Order line');
      const candidates = await catalogue.branchProducts(order.branch_id, { category: line.category });
      return { line_id: line.id, options: await substituteOptions(db, order, lines, line, [...candidates.values()]) };
    },
  };
}

export type OrdersService = ReturnType<typeof ordersService>;
