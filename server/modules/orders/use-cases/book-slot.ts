import { orderReference } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import { assertTakesStep } from '../order-steps';
import { actorOf, partyOf, type OrderContext } from './order-context';
import { readOrder } from './read-order';

/** Books a confirmed order into a slot, or moves it to another; the contractor is told the day. */
export async function bookSlot(ctx: OrderContext, user: AuthUser, id: number, slotId: number) {
  const { db, orders, slots } = ctx;
  assertTakesStep(user, 'book_slot');
  await db.transaction(async (trx) => {
    const order = await ctx.orderForStep(trx, user, id, 'book_slot');
    const slot = await slots.book(trx, user, order, slotId, await slots.loadOf(trx, order, await orders.lines(id, trx)));
    await orders.insertEvent(trx, id, { kind: 'slot_booked', actor: actorOf(user), summary: `Delivery booked ${slot.date} ${slot.time_window} on ${slot.registration}`, data: { slot_id: slot.id } });
    await ctx.notify(trx, 'slot_booked', id, partyOf(user));
  });
  return readOrder(ctx, user, id);
}

/** Takes a confirmed order off its slot while the lorry has not left. */
export async function releaseSlot(ctx: OrderContext, user: AuthUser, id: number) {
  const { db, orders, slots } = ctx;
  assertTakesStep(user, 'release_slot');
  await db.transaction(async (trx) => {
    await ctx.orderForStep(trx, user, id, 'release_slot');
    if (!(await slots.unbook(trx, id))) throw AppError.conflict('not_booked', `${orderReference(id)} is not booked into a slot`);
    await orders.insertEvent(trx, id, { kind: 'slot_released', actor: actorOf(user), summary: 'Delivery slot released', data: {} });
  });
  return readOrder(ctx, user, id);
}
