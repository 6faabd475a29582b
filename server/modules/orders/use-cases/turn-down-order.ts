import type { AuthUser } from '../../../auth/auth-user';
import { assertTakesStep } from '../order-steps';
import { actorOf, partyOf, type OrderContext } from './order-context';
import { readOrder } from './read-order';

/** The desk cannot supply the order: it is closed with the reason, and the contractor can order elsewhere. */
export async function turnDownOrder(ctx: OrderContext, user: AuthUser, id: number, reason: string) {
  const { db, orders } = ctx;
  assertTakesStep(user, 'turn_down');
  await db.transaction(async (trx) => {
    const order = await ctx.orderForStep(trx, user, id, 'turn_down');
    await ctx.moveStage(trx, order, 'turn_down', { revision: order.revision, bumpRevision: true });
    await orders.supersedeOpenProposals(trx, id);
    await orders.insertEvent(trx, id, { kind: 'turned_down', actor: actorOf(user), summary: `Turned down: ${reason}`, data: { reason } });
    await ctx.notify(trx, 'turned_down', id, partyOf(user), reason);
  });
  return readOrder(ctx, user, id);
}
