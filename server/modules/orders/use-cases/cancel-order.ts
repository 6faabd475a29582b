import type { AuthUser } from '../../../auth/auth-user';
import { nowIso } from '../../../db/time';
import { actorOf, partyOf, type OrderContext } from './order-context';
import { readOrder } from './read-order';

/** The contractor withdraws the order before the merchant confirms it; any open offer lapses. */
export async function cancelOrder(ctx: OrderContext, user: AuthUser, id: number, reason?: string) {
  const { db, orders } = ctx;
  await db.transaction(async (trx) => {
    const order = await ctx.orderForStep(trx, user, id, 'cancel');
    const now = nowIso();
    await ctx.moveStage(trx, order, 'cancel', { revision: order.revision, values: { cancelled_at: now }, bumpRevision: true });
    await orders.supersedeOpenProposals(trx, id);
    await orders.insertEvent(trx, id, { kind: 'cancelled', actor: actorOf(user), summary: reason ? `Cancelled: ${reason}` : 'Cancelled', data: reason ? { reason } : {} });
    await ctx.notify(trx, 'cancelled', id, partyOf(user), reason);
  });
  return readOrder(ctx, user, id);
}
