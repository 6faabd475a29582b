import { orderReference, type FollowUpBody } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { lockRow } from '../../../db/dialect';
import { nowIso } from '../../../db/time';
import { AppError } from '../../../http/app-error';
import { assertTakesStep } from '../order-steps';
import type { NewOrderLine } from '../orders.repository';
import { lineProduct } from '../repository/order-row';
import { actorOf, assertNotPast, partyOf, type OrderContext } from './order-context';
import { readOrder } from './read-order';

/**
 * Starts the delivery of an order's back-ordered packs: a new order to the same branch and site,
 * one line per back-ordered line at the price agreed on the first order, waiting for the desk to
 * confirm it against stock (it is already agreed with the contractor, so it arrives as agreed).
 * Both orders name each other on their timelines; the first keeps its back-order figures as the
 * record of what was promised. One follow-up per order.
 */
export async function startFollowUp(ctx: OrderContext, user: AuthUser, id: number, body: FollowUpBody) {
  const { db, orders } = ctx;
  assertTakesStep(user, 'start_follow_up');
  assertNotPast(ctx.deps.config.calendar, body.requested_date, 'requested_date');
  const followUpId = await db.transaction(async (trx) => {
    await lockRow(trx, 'orders', id);
    const order = await ctx.orderForStep(trx, user, id, 'start_follow_up');
    const existing = await orders.followUpOf(id, trx);
    if (existing)
      throw AppError.conflict('follow_up_exists', `The back-ordered packs of ${orderReference(id)} already follow as ${orderReference(existing.id)}`, [
        { message: `already follows as ${orderReference(existing.id)}`, order_id: existing.id, reference: orderReference(existing.id) },
      ]);
    const owed = (await orders.lines(id, trx)).filter((l) => l.back_order_quantity > 0);
    if (owed.length === 0) throw AppError.conflict('nothing_back_ordered', `${orderReference(id)} has no back-ordered packs to send`);
    const lines: NewOrderLine[] = owed.map((l) => ({
      ...lineProduct(l),
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
    await ctx.notify(trx, 'follow_up_started', newId, partyOf(user), body.note);
    return newId;
  });
  return readOrder(ctx, user, followUpId);
}
