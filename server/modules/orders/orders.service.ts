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
  type amendOrderBodySchema,
  type orderListQuerySchema,
  type placeOrderBodySchema,
  type proposalBodySchema,
} from '../../../shared/schemas/order.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';
import { AppError } from '../../http/app-error';
import { catalogueRepository, type BranchProductRow } from '../catalogue/catalogue.repository';
import { orderCautions } from '../estimates/cautions';
import { estimatesRepository } from '../estimates/estimates.repository';
import { projectsService } from '../projects/projects.service';
import { sendOrderMail, type OrderMailEvent } from './order-mail';
import { ordersRepository, type NewOrderLine, type OrderParty, type OrderRow } from './orders.repository';

type PlaceBody = z.output<typeof placeOrderBodySchema>;
type AmendBody = z.output<typeof amendOrderBodySchema>;
type ProposalBody = z.output<typeof proposalBodySchema>;
type ListQuery = z.output<typeof orderListQuerySchema>;

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
const todayIso = () => nowIso().slice(0, 10);

function invalid(path: string, message: string): AppError {
  return AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path, message }]);
}

function assertNotPast(date: string, path: string) {
  if (date < todayIso()) throw invalid(path, 'must be today or later');
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

  async function notify(event: OrderMailEvent, orderId: number, party: OrderParty, note?: string) {
    const order = (await orders.find(party, orderId))!;
    const [contractor, desk] = await Promise.all([orders.contractorEmails(order), orders.deskEmails(order.merchant_organisation_id)]);
    await sendOrderMail(deps, event, order, { contractor, desk }, note);
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

  async function get(user: AuthUser, id: number): Promise<Order> {
    const party = partyOf(user);
    const order = await orders.find(party, id);
    if (!order) throw AppError.notFound('Order');
    const [lines, proposals, timeline] = await Promise.all([orders.lines(id), orders.proposals(id), orders.events(id)]);
    return {
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

    async list(user: AuthUser, query: ListQuery) {
      const { rows, total } = await orders.list(partyOf(user), query);
      return { orders: rows.map(summary), total, page: query.page, page_size: query.page_size };
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
      assertNotPast(body.requested_date, 'requested_date');
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
        return orderId;
      });
      await notify('placed', id, partyOf(user));
      return get(user, id);
    },

    /** Changes what was asked for until the merchant confirms; any offer the desk made on the old order lapses. */
    async amend(user: AuthUser, id: number, body: AmendBody) {
      await db.transaction(async (trx) => {
        const order = await forStep(trx, user, id, 'amend', body.revision);
        const method = body.delivery_method ?? order.delivery_method;
        if (body.requested_date) assertNotPast(body.requested_date, 'requested_date');
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
      });
      await notify('amended', id, partyOf(user));
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
      });
      await notify('cancelled', id, partyOf(user), reason);
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
        if (body.proposed_date) assertNotPast(body.proposed_date, 'proposed_date');

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
            note: pl.note ?? '',
          };
        });
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
        return pid;
      });
      await notify('changes_offered', id, partyOf(user), body.message);
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
        for (const line of lines) {
          if (line.status === 'substitute') continue;
          const pl = answered.get(line.id);
          const confirmed = pl ? pl.confirmed_quantity : line.quantity;
          const backOrder = pl ? pl.back_order_quantity : 0;
          await orders.updateLine(trx, line.id, {
            confirmed_quantity: confirmed,
            back_order_quantity: backOrder,
            total: line.unit_price * (confirmed + backOrder),
            status: lineStatus(line.quantity, confirmed, backOrder, Boolean(pl?.substitute)),
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
      });
      await notify('changes_accepted', id, partyOf(user), note);
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
      });
      await notify('changes_declined', id, partyOf(user), note);
      return get(user, id);
    },
  };
}

export type OrdersService = ReturnType<typeof ordersService>;
