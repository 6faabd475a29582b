import type { z } from 'zod';
import type { SubstituteFigures, proposalBodySchema } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import { assertTakesStep } from '../order-steps';
import { substituteTileFigures } from '../substitutes';
import { actorOf, assertNotPast, partyOf, type OrderContext } from './order-context';
import { readOrder } from './read-order';

type ProposalBody = z.output<typeof proposalBodySchema>;

/**
 * The desk's answer with changes: per line what it sends now, what it back-orders and what it
 * offers instead, and a delivery day or slot. The contractor accepts or declines it as a whole.
 */
export async function offerChanges(ctx: OrderContext, user: AuthUser, id: number, body: ProposalBody) {
  const { db, orders, catalogue, slots } = ctx;
  assertTakesStep(user, 'offer_changes');
  const proposalId = await db.transaction(async (trx) => {
    const order = await ctx.orderForStep(trx, user, id, 'offer_changes', { expected: body.revision, changedMessage: 'The contractor changed the order; reload it before answering' });
    if (body.proposed_date) assertNotPast(ctx.deps.config.calendar, body.proposed_date, 'proposed_date');

    const lines = await orders.lines(id, trx);
    const subIds = (body.lines ?? []).flatMap((l) => (l.substitute ? [l.substitute.product_id] : []));
    const subs = await catalogue.branchProducts(order.branch_id, subIds, trx);
    const problems: { path: string; message: string }[] = [];
    const seen = new Set<number>();
    const proposalLines = (body.lines ?? []).map((pl, i) => {
      const line = lines.find((l) => l.id === pl.line_id);
      if (!line || line.status === 'substitute') problems.push({ path: `lines.${i}.line_id`, message: 'is not a line of this order' });
      else if (seen.has(line.id)) problems.push({ path: `lines.${i}.line_id`, message: 'is answered twice' });
      else {
        seen.add(line.id);
        if (pl.confirmed_quantity + pl.back_order_quantity > line.quantity) {
          problems.push({ path: `lines.${i}.confirmed_quantity`, message: `confirmed and back-ordered packs must add up to at most the ${line.quantity} asked for` });
        }
        if (pl.substitute && pl.confirmed_quantity + pl.back_order_quantity === line.quantity) {
          problems.push({ path: `lines.${i}.substitute`, message: 'the whole quantity is already confirmed or back-ordered: there is nothing to substitute' });
        }
      }
      const sub = pl.substitute ? subs.get(pl.substitute.product_id) : undefined;
      if (pl.substitute && !sub) problems.push({ path: `lines.${i}.substitute.product_id`, message: `is not a product ${order.branch_name} sells` });
      return {
        order_line_id: pl.line_id,
        confirmed_quantity: pl.confirmed_quantity,
        back_order_quantity: pl.back_order_quantity,
        substitute_product_id: pl.substitute?.product_id ?? null,
        substitute_quantity: pl.substitute?.quantity ?? null,
        substitute_unit_price: pl.substitute ? (pl.substitute.unit_price ?? sub?.pack_price ?? 0) : null,
        substitute_figures: null as SubstituteFigures | null,
        note: pl.note ?? '',
      };
    });
    if (body.proposed_slot_id !== undefined) {
      const slot = await slots.slot(user.organisation.id, body.proposed_slot_id, trx);
      if (!slot || slot.branch_id !== order.branch_id) problems.push({ path: 'proposed_slot_id', message: `is not a delivery slot of ${order.branch_name}` });
    }
    // A substitute tile is worked out on the order's own roof by the engine before it can be offered.
    for (const [i, pl] of proposalLines.entries()) {
      const line = lines.find((l) => l.id === pl.order_line_id);
      const sub = pl.substitute_product_id ? subs.get(pl.substitute_product_id) : undefined;
      if (!line || !sub || line.category !== 'tile' || sub.category !== 'tile') continue;
      if (pl.confirmed_quantity + pl.back_order_quantity > 0) {
        problems.push({ path: `lines.${i}.substitute`, message: `another tile cannot be laid beside ${line.sku} on the same roof: offer ${sub.sku} for the whole line (none now, none to follow)` });
        continue;
      }
      const worked = await substituteTileFigures(trx, order, lines, sub, pl.substitute_unit_price ?? sub.pack_price);
      if (!worked.ok) {
        problems.push({ path: `lines.${i}.substitute.product_id`, message: worked.reason });
        continue;
      }
      const refused = worked.figures.refused_faces;
      if (refused.length > 0) {
        for (const r of refused) problems.push({ path: `lines.${i}.substitute.product_id`, message: `${sub.sku} does not suit ${r.message}` });
        continue;
      }
      if (pl.substitute_quantity !== worked.packs) {
        problems.push({ path: `lines.${i}.substitute.quantity`, message: `the engine counts ${worked.packs} packs of ${sub.sku} for this roof (${pl.substitute_quantity} given)` });
        continue;
      }
      pl.substitute_figures = worked.figures;
    }
    if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'Some lines of the answer are not valid', problems);

    const pid = await orders.insertProposal(
      trx,
      {
        order_id: id,
        order_revision: order.revision,
        message: body.message ?? '',
        proposed_date: body.proposed_date ?? null,
        proposed_time_window: body.proposed_time_window ?? null,
        proposed_slot_id: body.proposed_slot_id ?? null,
        proposed_by: user.id,
      },
      proposalLines,
    );
    await ctx.moveStage(trx, order, 'offer_changes', { revision: order.revision, bumpRevision: false });
    const parts = [
      proposalLines.length > 0 ? `${proposalLines.length} ${proposalLines.length === 1 ? 'line' : 'lines'}` : null,
      body.proposed_date ? `delivery ${body.proposed_date}${body.proposed_time_window ? ` ${body.proposed_time_window}` : ''}` : null,
      body.proposed_slot_id ? 'a delivery slot' : null,
    ].filter(Boolean);
    await orders.insertEvent(trx, id, { kind: 'changes_offered', actor: actorOf(user), summary: `Offered changes: ${parts.join(', ')}`, data: { proposal_id: pid } });
    await ctx.notify(trx, 'changes_offered', id, partyOf(user), body.message);
    return pid;
  });
  return { proposal_id: proposalId, order: await readOrder(ctx, user, id) };
}
