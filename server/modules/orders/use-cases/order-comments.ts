import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import { actorOf, partyOf, type OrderContext } from './order-context';

/** The comments between the two sides on an order, oldest first. */
export async function orderComments(ctx: OrderContext, user: AuthUser, id: number) {
  const { orders } = ctx;
  if (!(await orders.find(partyOf(user), id))) throw AppError.notFound('Order');
  return { comments: (await orders.comments(id)).map(({ organisationKind: _kind, ...c }) => c) };
}

/** A comment between the two sides; it goes on the timeline too. */
export async function addComment(ctx: OrderContext, user: AuthUser, id: number, body: string) {
  const { db, orders } = ctx;
  const commentId = await db.transaction(async (trx) => {
    const order = await orders.find(partyOf(user), id, trx);
    if (!order) throw AppError.notFound('Order');
    const cid = await orders.insertComment(trx, id, { userId: user.id, name: user.name, organisationId: user.organisation.id, body });
    await orders.insertEvent(trx, id, { kind: 'commented', actor: actorOf(user), summary: `Comment: ${body.length > 120 ? `${body.slice(0, 117)}…` : body}`, data: { comment_id: cid } });
    await ctx.notify(trx, 'commented', id, partyOf(user), body);
    return cid;
  });
  const c = (await orders.comments(id)).find((x) => x.id === commentId)!;
  const { organisationKind: _kind, ...comment } = c;
  return comment;
}
