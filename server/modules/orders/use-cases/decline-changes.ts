import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import { actorOf, partyOf, type OrderContext } from './order-context';
import { readOrder } from './read-order';

/** Declining leaves the order as it was sent; the desk answers again (confirms, offers again or turns it down). */
export async function declineChanges(ctx: OrderContext, user: AuthUser, id: number, proposalId: number, note?: string) {
  const { db, orders } = ctx;
  await db.transaction(async (trx) => {
    const order = await ctx.orderForStep(trx, user, id, 'decline_changes');
    const proposal = (await orders.proposals(id, trx)).find((p) => p.id === proposalId);
    if (!proposal) throw AppError.notFound('Proposal');
    if (!(await orders.answerProposal(trx, proposalId, 'declined', user.id))) throw AppError.conflict('proposal_closed', 'This offer is no longer open');
    await ctx.moveStage(trx, order, 'decline_changes', { revision: order.revision, bumpRevision: false });
    await orders.insertEvent(trx, id, {
      kind: 'changes_declined',
      actor: actorOf(user),
      summary: note ? `Declined the offered changes: ${note}` : 'Declined the offered changes',
      data: { proposal_id: proposalId },
    });
    await ctx.notify(trx, 'changes_declined', id, partyOf(user), note);
  });
  return readOrder(ctx, user, id);
}
