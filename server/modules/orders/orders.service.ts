import type { z } from 'zod';
import type { FollowUpBody, amendOrderBodySchema, confirmOrderBodySchema, placeOrderBodySchema, proposalBodySchema } from '../../../shared/schemas/order.schema';
import type { AuthUser } from '../../auth/auth-user';
import type { Db } from '../../db/knex';
import type { NewOrderLine } from './orders.repository';
import { acceptChanges } from './use-cases/accept-changes';
import { amendOrder } from './use-cases/amend-order';
import { bookSlot, releaseSlot } from './use-cases/book-slot';
import { cancelOrder } from './use-cases/cancel-order';
import { confirmOrder } from './use-cases/confirm-order';
import { declineChanges } from './use-cases/decline-changes';
import { dispatchOrder } from './use-cases/dispatch-order';
import { listSubstitutes } from './use-cases/list-substitutes';
import { offerChanges } from './use-cases/offer-changes';
import { orderBook } from './use-cases/order-book';
import { addComment, orderComments } from './use-cases/order-comments';
import { newLine, orderContext, type OrderDeps } from './use-cases/order-context';
import { placeOrder } from './use-cases/place-order';
import { orderSummary, readOrder } from './use-cases/read-order';
import { startFollowUp } from './use-cases/start-follow-up';
import { turnDownOrder } from './use-cases/turn-down-order';

export { partyOf } from './use-cases/order-context';

/**
 * The orders module's use cases over one shared context (repositories, services, e-mail, prices and
 * the step checks); each lives in its own file under use-cases/. Every step on an order is checked
 * against the one table of steps (ORDER_STEPS, through order-steps.ts).
 */
export function ordersService(deps: OrderDeps) {
  const ctx = orderContext(deps);
  return {
    get: (user: AuthUser, id: number) => readOrder(ctx, user, id),
    summary: orderSummary,
    newLine,
    listPage: orderBook(ctx),
    place: (user: AuthUser, body: z.output<typeof placeOrderBodySchema>, from?: { quoteId?: number; lines?: NewOrderLine[]; alsoInTransaction?: (trx: Db, orderId: number) => Promise<void> }) =>
      placeOrder(ctx, user, body, from),
    amend: (user: AuthUser, id: number, body: z.output<typeof amendOrderBodySchema>) => amendOrder(ctx, user, id, body),
    cancel: (user: AuthUser, id: number, reason?: string) => cancelOrder(ctx, user, id, reason),
    offerChanges: (user: AuthUser, id: number, body: z.output<typeof proposalBodySchema>) => offerChanges(ctx, user, id, body),
    acceptChanges: (user: AuthUser, id: number, proposalId: number, note?: string) => acceptChanges(ctx, user, id, proposalId, note),
    declineChanges: (user: AuthUser, id: number, proposalId: number, note?: string) => declineChanges(ctx, user, id, proposalId, note),
    confirm: (user: AuthUser, id: number, body: z.output<typeof confirmOrderBodySchema>) => confirmOrder(ctx, user, id, body),
    turnDown: (user: AuthUser, id: number, reason: string) => turnDownOrder(ctx, user, id, reason),
    bookSlot: (user: AuthUser, id: number, slotId: number) => bookSlot(ctx, user, id, slotId),
    unbookSlot: (user: AuthUser, id: number) => releaseSlot(ctx, user, id),
    dispatch: (user: AuthUser, id: number) => dispatchOrder(ctx, user, id),
    startFollowUp: (user: AuthUser, id: number, body: FollowUpBody) => startFollowUp(ctx, user, id, body),
    comments: (user: AuthUser, id: number) => orderComments(ctx, user, id),
    comment: (user: AuthUser, id: number, body: string) => addComment(ctx, user, id, body),
    linesOf: (orderId: number) => ctx.orders.lines(orderId),
    substitutes: (user: AuthUser, id: number, lineId: number) => listSubstitutes(ctx, user, id, lineId),
  };
}

export type OrdersService = ReturnType<typeof ordersService>;
