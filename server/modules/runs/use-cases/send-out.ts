import type { z } from 'zod';
import { can } from '../../../../shared/domain/policy';
import { ORDER_TRANSITIONS, orderReference, stageAllows } from '../../../../shared/schemas/order.schema';
import type { Run, sendOutBodySchema } from '../../../../shared/schemas/run.schema';
import type { AuthUser } from '../../../auth/auth-user';
import type { Db } from '../../../db/knex';
import { AppError } from '../../../http/app-error';
import { sendOrderMail } from '../../orders/order-mail';
import { assemble } from '../run-assembly';
import type { RunContext } from './run-context';

type SendOutBody = z.output<typeof sendOutBodySchema>;

/**
 * Sends the run out: every confirmed drop goes on the road in one transaction. Refused (409) before
 * its day or with a pallet not loaded, unless a dispatcher or the owner overrides with a reason,
 * which goes on each order's timeline.
 */
export async function sendOut(ctx: RunContext, user: AuthUser, id: number, body: SendOutBody): Promise<Run> {
  const { db, repo, orders } = ctx;
  const t = ORDER_TRANSITIONS.dispatch;
  const sent: number[] = [];
  await db.transaction(async (trx) => {
    const d = await ctx.detail(user, id, trx);
    if (d.row.sent_out_at) throw AppError.conflict('run_sent_out', `${d.row.registration}'s run left the yard at ${d.row.sent_out_at}`);
    const going = d.drops.filter((x) => stageAllows('dispatch', x.status)).map((x) => x.order_id);
    if (going.length === 0) throw AppError.conflict('nothing_to_send', `${d.row.registration}'s run has no confirmed drop to send out`);
    if (!d.row.driver_user_id) throw AppError.conflict('no_driver', `Assign a driver to ${d.row.registration} on ${d.row.date} ${d.row.time_window} first`);
    const refusal = ctx.readiness(d, going);
    if (refusal && !body.override_reason) throw AppError.conflict(refusal.code, refusal.message);
    if (refusal && !can(user.role, 'runs:override')) throw AppError.forbidden('Only a dispatcher or the merchant owner may send a run out against the rules');
    const override = refusal ? body.override_reason! : null;
    const actor = { userId: user.id, name: user.name, organisationId: user.organisation.id };
    for (const orderId of going) {
      if (!(await orders.updateIf(trx, orderId, { statuses: t.from }, { status: t.to }, false)))
        throw AppError.conflict('order_changed', `${orderReference(orderId)} changed at the same moment; reload the run and try again`);
      await orders.insertEvent(trx, orderId, {
        kind: 'dispatched',
        actor,
        summary: `Out for delivery on ${d.row.registration} with ${d.row.driver_name}`,
        data: { slot_id: d.row.id },
      });
      if (override && refusal) {
        await orders.insertEvent(trx, orderId, {
          kind: 'send_out_override',
          actor,
          summary: `Sent out against the rule (${refusal.code === 'not_today' ? 'not its day' : 'not every pallet ticked loaded'}): ${override}`,
          data: { slot_id: d.row.id, rule: refusal.code, reason: override },
        });
      }
      sent.push(orderId);
    }
    await repo.markSentOut(trx, d.row.id, { by: user.id, override });
    const party = { kind: 'merchant' as const, organisationId: user.organisation.id };
    for (const orderId of sent) {
      const order = await orders.find(party, orderId, trx);
      if (!order) continue;
      const contractor = await orders.contractorEmails(order, trx);
      const desk = await orders.deskEmails(order.merchant_organisation_id, trx);
      await sendOrderMail(trx, ctx.deps, 'dispatched', order, { contractor, desk }, undefined, { date: d.row.date, time_window: d.row.time_window, registration: d.row.registration }, 'merchant');
    }
  });
  return (await ctx.detail(user, id)).run;
}

/**
 * For the per-order dispatch: the same rules as the run's send-out, for that order's pallets. An
 * order not booked on a run is left to the caller's own rule.
 */
export async function assertOrderMayLeave(ctx: RunContext, user: AuthUser, orderId: number, trx: Db): Promise<void> {
  const b = await ctx.repo.bookingOf(orderId, trx);
  if (!b) return;
  const row = await ctx.repo.find(user.organisation.id, b.slot_id, trx);
  if (!row) return;
  const d = (await assemble(ctx.repo, [row], trx))[0];
  const refusal = ctx.readiness(d, [orderId]);
  if (refusal) throw AppError.conflict(refusal.code, `${refusal.message}. A dispatcher may send the whole run out with a reason.`);
}
