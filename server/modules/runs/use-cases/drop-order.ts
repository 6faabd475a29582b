import { orderReference } from '../../../../shared/schemas/order.schema';
import type { Run } from '../../../../shared/schemas/run.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import type { RunContext } from './run-context';

/** Sets the drop order: the list must name every drop of the run once. */
export async function setDropOrder(ctx: RunContext, user: AuthUser, id: number, orderIds: number[]): Promise<Run> {
  const { db, repo } = ctx;
  await db.transaction(async (trx) => {
    const row = await ctx.runOf(user, id, trx);
    if (row.sent_out_at) throw AppError.conflict('run_sent_out', `${row.registration}'s run has left the yard: its drop order no longer changes`);
    const drops = await repo.drops([row.id], trx);
    const ids = new Set(drops.map((d) => d.order_id));
    const seen = new Set<number>();
    const problems: { path: string; message: string }[] = [];
    orderIds.forEach((oid, i) => {
      if (!ids.has(oid)) problems.push({ path: `order_ids.${i}`, message: `${orderReference(oid)} is not a drop of this run` });
      else if (seen.has(oid)) problems.push({ path: `order_ids.${i}`, message: `${orderReference(oid)} is named twice` });
      seen.add(oid);
    });
    const missing = [...ids].filter((oid) => !seen.has(oid));
    if (missing.length > 0) problems.push({ path: 'order_ids', message: `must name every drop of the run once; missing ${missing.map(orderReference).join(', ')}` });
    if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'The drop order is not valid', problems);
    await repo.setDropOrder(trx, row.id, orderIds);
  });
  return (await ctx.detail(user, id)).run;
}
