import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import type { NewOrderLine } from '../orders.repository';
import { actorOf, lineStatus, newLine, partyOf, type OrderContext } from './order-context';
import { readOrder } from './read-order';

/** Accepting makes the desk's offer the order: agreed and back-ordered packs, substitutes as new lines, the new day. */
export async function acceptChanges(ctx: OrderContext, user: AuthUser, id: number, proposalId: number, note?: string) {
  const { db, orders, catalogue } = ctx;
  await db.transaction(async (trx) => {
    const order = await ctx.orderForStep(trx, user, id, 'accept_changes');
    const proposal = (await orders.proposals(id, trx)).find((p) => p.id === proposalId);
    if (!proposal) throw AppError.notFound('Proposal');
    if (proposal.status !== 'open' || proposal.order_revision !== order.revision) {
      throw AppError.conflict('proposal_closed', 'This offer is no longer open');
    }
    const lines = await orders.lines(id, trx);
    const answered = new Map(proposal.lines.map((pl) => [pl.order_line_id, pl]));
    const substitutes: NewOrderLine[] = [];
    const subProducts = await catalogue.branchProducts(
      order.branch_id,
      proposal.lines.flatMap((pl) => (pl.substitute ? [pl.substitute.product_id] : [])),
      trx,
    );
    // A substitute tile changes what else the roof takes (battens, fixings, ridge…): the engine's
    // difference for each of those items moves the order's line for it, or adds one.
    const accessoryDelta = new Map<number, number>();
    const accessoryNew: { product_id: number; packs: number; unit_price: number }[] = [];
    for (const pl of proposal.lines) {
      for (const row of pl.substitute?.figures?.rows ?? []) {
        if (row.role === 'tile' || !row.changes) continue;
        const productId = row.before?.product_id ?? row.after?.product_id;
        if (!productId) continue;
        const delta = (row.after?.packs ?? 0) - (row.before?.packs ?? 0);
        const onOrder = lines.find((l) => l.product_id === productId && l.status !== 'substitute' && !answered.has(l.id));
        if (onOrder) accessoryDelta.set(onOrder.id, (accessoryDelta.get(onOrder.id) ?? 0) + delta);
        else if (delta > 0 && row.after?.product_id) accessoryNew.push({ product_id: row.after.product_id, packs: delta, unit_price: row.after.unit_price ?? 0 });
      }
    }
    for (const line of lines) {
      if (line.status === 'substitute') continue;
      const pl = answered.get(line.id);
      const wanted = line.quantity + (accessoryDelta.get(line.id) ?? 0);
      // An item the substitute tile no longer needs (clips for a tile laid without them) stays on the order as replaced.
      const quantity = wanted > 0 ? wanted : line.quantity;
      const confirmed = pl ? pl.confirmed_quantity : wanted > 0 ? quantity : 0;
      const backOrder = pl ? pl.back_order_quantity : 0;
      await orders.updateLine(trx, line.id, {
        ...(quantity !== line.quantity ? { quantity } : {}),
        confirmed_quantity: confirmed,
        back_order_quantity: backOrder,
        total: line.unit_price * (confirmed + backOrder),
        status: lineStatus(quantity, confirmed, backOrder, Boolean(pl?.substitute) || wanted <= 0),
      });
      if (pl?.substitute) {
        const product = subProducts.get(pl.substitute.product_id);
        if (!product) throw AppError.conflict('substitute_unavailable', `${pl.substitute.sku} is no longer sold by ${order.branch_name}; ask the merchant to answer again`);
        substitutes.push({
          ...newLine(product, pl.substitute.quantity, 'substitute', pl.substitute.unit_price),
          confirmed_quantity: pl.substitute.quantity,
          replaces_line_id: line.id,
        });
      }
    }
    const added = await catalogue.branchProducts(
      order.branch_id,
      accessoryNew.map((a) => a.product_id),
      trx,
    );
    for (const a of accessoryNew) {
      const product = added.get(a.product_id);
      if (product) substitutes.push({ ...newLine(product, a.packs, 'agreed', a.unit_price), confirmed_quantity: a.packs });
    }
    await orders.insertLines(trx, id, substitutes, lines.length + 1);
    const subtotal = (await orders.lines(id, trx)).reduce((s, l) => s + l.total, 0);
    await orders.answerProposal(trx, proposalId, 'accepted', user.id);
    const values: Record<string, unknown> = { subtotal };
    if (proposal.proposed_date) values.requested_date = proposal.proposed_date;
    if (proposal.proposed_time_window) values.time_window = proposal.proposed_time_window;
    await ctx.moveStage(trx, order, 'accept_changes', { revision: order.revision, values, bumpRevision: true });
    await orders.insertEvent(trx, id, {
      kind: 'changes_accepted',
      actor: actorOf(user),
      summary: note ? `Accepted the offered changes: ${note}` : 'Accepted the offered changes',
      data: { proposal_id: proposalId, substitutes: substitutes.length },
    });
    await ctx.notify(trx, 'changes_accepted', id, partyOf(user), note);
  });
  return readOrder(ctx, user, id);
}
