import { orderReference } from '../../../../shared/schemas/order.schema';
import type { PalletView, Run } from '../../../../shared/schemas/run.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import { palletItems } from '../run-assembly';
import { invalid, type RunContext } from './run-context';

/** Ticks (or unticks) the pallet at an index of the run's deck positions. */
export async function setLoaded(ctx: RunContext, user: AuthUser, id: number, index: number, loaded: boolean): Promise<Run> {
  const d = await ctx.detail(user, id);
  if (d.row.sent_out_at) throw AppError.conflict('run_sent_out', `${d.row.registration}'s run has left the yard`);
  const p = d.deck.positions[index];
  if (!p) throw invalid('index', d.deck.positions.length === 0 ? 'the run has no pallets' : `must be a position of the deck, 0 to ${d.deck.positions.length - 1}`);
  if (loaded) await ctx.repo.markLoaded(d.row.id, p.order_id, p.pallet, user.id);
  else await ctx.repo.unmarkLoaded(d.row.id, p.order_id, p.pallet);
  return (await ctx.detail(user, id)).run;
}

/** One pallet as its label's QR code opens it. */
export async function palletView(ctx: RunContext, user: AuthUser, orderId: number, n: number): Promise<PalletView> {
  if (user.organisation.kind !== 'merchant') throw AppError.notFound('Order');
  const order = await ctx.orders.find({ kind: 'merchant', organisationId: user.organisation.id }, orderId);
  if (!order) throw AppError.notFound('Order');
  const b = await ctx.repo.bookingOf(orderId);
  if (!b) throw AppError.conflict('not_booked', `${orderReference(orderId)} is not booked onto a run: it has no pallets yet`);
  const d = await ctx.detail(user, b.slot_id);
  const drop = d.drops.findIndex((x) => x.order_id === orderId);
  const plan = d.drops[drop].plan.pallets;
  const pallet = plan.find((p) => p.n === n);
  if (!pallet) throw AppError.notFound('Pallet');
  const index = d.deck.positions.findIndex((p) => p.order_id === orderId && p.pallet === n);
  return {
    order_id: orderId,
    reference: orderReference(orderId),
    site_name: order.site_name,
    pallet: n,
    pallets: plan.length,
    drop: drop + 1,
    drops: d.drops.length,
    run_id: d.row.id,
    position_index: index >= 0 ? index : null,
    weight_kg: pallet.weight_kg,
    faces: pallet.faces,
    items: palletItems(pallet, d.names.get(orderId)),
    loaded: index >= 0 ? d.deck.positions[index].loaded : false,
  };
}
