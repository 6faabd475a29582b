import type { z } from 'zod';
import type { amendOrderBodySchema } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { actorOf, assertCraneAllowed, assertNotPast, partyOf, type OrderContext } from './order-context';
import { readOrder } from './read-order';

type AmendBody = z.output<typeof amendOrderBodySchema>;

/** Changes what was asked for until the merchant confirms; any offer the desk made on the old order lapses. */
export async function amendOrder(ctx: OrderContext, user: AuthUser, id: number, body: AmendBody) {
  const { db, orders } = ctx;
  await db.transaction(async (trx) => {
    const order = await ctx.orderForStep(trx, user, id, 'amend', { expected: body.revision });
    const method = body.delivery_method ?? order.delivery_method;
    if (body.requested_date) assertNotPast(ctx.deps.config.calendar, body.requested_date, 'requested_date');
    assertCraneAllowed(method, order.site, 'delivery_method');
    const changes: string[] = [];
    const values: Record<string, unknown> = {};
    for (const key of ['requested_date', 'time_window', 'delivery_method', 'notes', 'po_reference'] as const) {
      if (body[key] !== undefined && body[key] !== order[key]) {
        values[key] = body[key];
        changes.push(key);
      }
    }
    if (body.lines) {
      const lines = await ctx.priceLines(order.branch_id, order.branch_name, body.lines, (i) => `lines.${i}.product_id`, trx);
      await orders.replaceLines(trx, id, lines);
      values.subtotal = lines.reduce((s, l) => s + l.total, 0);
      changes.push('lines');
    }
    await ctx.moveStage(trx, order, 'amend', { revision: body.revision, values, bumpRevision: true, changedMessage: 'The order changed while you were editing it; reload it and try again' });
    await orders.supersedeOpenProposals(trx, id);
    await orders.insertEvent(trx, id, {
      kind: 'amended',
      actor: actorOf(user),
      summary: changes.length > 0 ? `Changed ${changes.join(', ').replace(/_/g, ' ')}` : 'Sent again unchanged',
      data: { changes },
    });
    await ctx.notify(trx, 'amended', id, partyOf(user));
  });
  return readOrder(ctx, user, id);
}
