import { orderReference } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import { assertTakesStep } from '../order-steps';
import { actorOf, partyOf, type OrderContext } from './order-context';
import { readOrder } from './read-order';

/** The lorry leaves the yard: the order must be booked into a slot with a driver. */
export async function dispatchOrder(ctx: OrderContext, user: AuthUser, id: number) {
  const { db, orders, slots, runs } = ctx;
  assertTakesStep(user, 'dispatch');
  await db.transaction(async (trx) => {
    const order = await ctx.orderForStep(trx, user, id, 'dispatch');
    const booking = await slots.booking(id, trx);
    if (!booking) throw AppError.conflict('not_booked', `Book ${orderReference(id)} into a delivery slot before it goes out`);
    const slot = (await slots.slot(user.organisation.id, booking.slot_id, trx))!;
    if (!slot.driver_user_id) throw AppError.conflict('no_driver', `Assign a driver to ${slot.registration} on ${slot.date} ${slot.time_window} first`);
    // The same rules as the run's send-out: its day, every pallet of this order ticked loaded.
    await runs.assertOrderMayLeave(user, id, trx);
    await ctx.moveStage(trx, order, 'dispatch', { bumpRevision: false });
    await orders.insertEvent(trx, id, { kind: 'dispatched', actor: actorOf(user), summary: `Out for delivery on ${slot.registration} with ${slot.driver_name}`, data: { slot_id: slot.id } });
    await ctx.notify(trx, 'dispatched', id, partyOf(user));
  });
  return readOrder(ctx, user, id);
}
