import { ORDER_STEPS, orderReference, type OrderLineStatus, type OrderSite, type OrderStep } from '../../../../shared/schemas/order.schema';
import type { BusinessCalendar } from '../../../../shared/domain/business-calendar';
import { bookingDateProblem } from '../../../../shared/domain/booking-window';
import type { AppDeps } from '../../../app-deps';
import type { AuthUser } from '../../../auth/auth-user';
import type { Db } from '../../../db/knex';
import { AppError } from '../../../http/app-error';
import { catalogueRepository, type BranchProductRow } from '../../catalogue/catalogue.repository';
import { estimatesRepository } from '../../estimates/estimates.repository';
import { projectsService } from '../../projects/projects.service';
import { runsService } from '../../runs/runs.service';
import { slotsService } from '../../slots/slots.service';
import { stockRepository } from '../../stock/stock.repository';
import { sendOrderMail, type OrderMailEvent } from '../order-mail';
import { assertStage, assertTakesStep, nextStage } from '../order-steps';
import { ordersRepository, type NewOrderLine, type OrderParty, type OrderRow } from '../orders.repository';

export type OrderDeps = Pick<AppDeps, 'db' | 'mailer' | 'logger' | 'config'>;

export const partyOf = (user: AuthUser): OrderParty => ({ kind: user.organisation.kind, organisationId: user.organisation.id });
export const actorOf = (user: AuthUser) => ({ userId: user.id, name: user.name, organisationId: user.organisation.id });

export function invalid(path: string, message: string): AppError {
  return AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path, message }]);
}

/** A delivery day asked for or offered: today up to the end of the booking window. */
export function assertNotPast(calendar: BusinessCalendar, date: string, path: string) {
  const problem = bookingDateProblem(calendar, date);
  if (problem) throw invalid(path, problem);
}

/** A roof delivery needs the lorry's crane, which the site may not allow. */
export function assertCraneAllowed(method: 'ground' | 'roof', site: Pick<OrderSite, 'crane_lift'>, path: string) {
  if (method === 'roof' && site.crane_lift === 'not_allowed') {
    throw invalid(path, "the site's access notes say the lorry crane cannot lift there: choose ground, or change the site's access notes");
  }
}

export function lineStatus(quantity: number, confirmed: number, backOrder: number, substituted: boolean): OrderLineStatus {
  if (confirmed === quantity) return 'agreed';
  if (confirmed === 0 && backOrder === quantity) return 'back_ordered';
  if (confirmed + backOrder === 0) return substituted ? 'replaced' : 'not_available';
  return 'part_agreed';
}

export function newLine(p: BranchProductRow, quantity: number, status: OrderLineStatus, unitPrice = p.pack_price): NewOrderLine {
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

const CHANGED_AT_ONCE = 'The order changed at the same moment; reload it and try again';

/**
 * What every order use case works with: the app's deps, the repositories and services it calls,
 * the e-mail to both sides, branch prices, and the step checks against the one table of steps.
 */
export function orderContext(deps: OrderDeps) {
  const { db } = deps;
  const orders = ordersRepository(db);
  const catalogue = catalogueRepository(db);
  const slots = slotsService(deps);

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
    const problems = wanted.map((l, i) => (products.has(l.product_id) ? null : { path: path(i), message: `is not a product ${branchName} sells` })).filter((p): p is { path: string; message: string } => p !== null);
    if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'Some lines cannot be ordered from this branch', problems);
    return wanted.map((l) => newLine(products.get(l.product_id)!, l.quantity, 'asked'));
  }

  /**
   * Loads the caller's order inside a transaction for a step: the side and role must take the step
   * (403), the order must be theirs (404) and in a stage the step starts from (409), and, when a
   * revision is given, still at that revision (409 order_changed with `changedMessage`).
   */
  async function orderForStep(trx: Db, user: AuthUser, id: number, step: OrderStep, revision?: { expected: number | undefined; changedMessage?: string }): Promise<OrderRow> {
    assertTakesStep(user, step);
    const order = await orders.find(partyOf(user), id, trx);
    if (!order) throw AppError.notFound('Order');
    assertStage(order, step);
    if (revision && revision.expected !== undefined && revision.expected !== order.revision) {
      throw AppError.conflict('order_changed', revision.changedMessage ?? `Order ${orderReference(order.id)} has changed since you opened it; reload it and try again`);
    }
    return order;
  }

  /**
   * Moves the order to the step's next stage only if it is still in a stage the step starts from
   * (and, when given, at the revision it was read at), so two people acting at once cannot both win.
   */
  async function moveStage(trx: Db, order: Pick<OrderRow, 'id' | 'status'>, step: OrderStep, o: { revision?: number; values?: Record<string, unknown>; bumpRevision: boolean; changedMessage?: string }) {
    const values = { status: nextStage(step, order.status), ...o.values };
    if (!(await orders.updateIf(trx, order.id, { statuses: ORDER_STEPS[step].from, revision: o.revision }, values, o.bumpRevision))) {
      throw AppError.conflict('order_changed', o.changedMessage ?? CHANGED_AT_ONCE);
    }
  }

  return {
    deps,
    db,
    orders,
    catalogue,
    estimates: estimatesRepository(db),
    stock: stockRepository(db),
    projects: projectsService(deps),
    slots,
    runs: runsService(deps),
    notify,
    priceLines,
    orderForStep,
    moveStage,
  };
}

export type OrderContext = ReturnType<typeof orderContext>;
