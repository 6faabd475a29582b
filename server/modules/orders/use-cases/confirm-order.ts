import type { z } from 'zod';
import { orderReference, type OrderLineStatus, type confirmOrderBodySchema } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { nowIso } from '../../../db/time';
import { AppError } from '../../../http/app-error';
import { assertTakesStep } from '../order-steps';
import { actorOf, lineStatus, partyOf, type OrderContext } from './order-context';
import { readOrder } from './read-order';

type ConfirmBody = z.output<typeof confirmOrderBodySchema>;

/**
 * The desk confirms: each line's packs to send now are held from the branch's stock in the same
 * transaction (the rest is back-ordered), and the order is booked into a slot when one is given.
 * If any line lacks the stock, nothing is held and the answer is 409 insufficient_stock naming
 * each SKU with the packs free and the packs asked for.
 */
export async function confirmOrder(ctx: OrderContext, user: AuthUser, id: number, body: ConfirmBody) {
  const { db, orders, stock, slots } = ctx;
  assertTakesStep(user, 'confirm');
  await db.transaction(async (trx) => {
    const order = await ctx.orderForStep(trx, user, id, 'confirm');
    const lines = await orders.lines(id, trx);
    const wanted = new Map((body.lines ?? []).map((l) => [l.line_id, l.quantity]));
    const problems: { path: string; message: string }[] = [];
    (body.lines ?? []).forEach((l, i) => {
      if (!lines.some((x) => x.id === l.line_id)) problems.push({ path: `lines.${i}.line_id`, message: 'is not a line of this order' });
    });
    const plan = lines.map((line) => {
      // What is open to send: the agreed packs after accepted changes, the packs asked for otherwise.
      const open = line.confirmed_quantity ?? line.quantity;
      const send = wanted.get(line.id) ?? open;
      return { line, open, send, back: line.back_order_quantity + Math.max(0, open - send) };
    });
    plan.forEach((p) => {
      if (p.send > p.open) {
        const i = (body.lines ?? []).findIndex((l) => l.line_id === p.line.id);
        problems.push({ path: `lines.${i}.quantity`, message: `at most the ${p.open} packs ${order.status === 'agreed' ? 'agreed' : 'asked for'}` });
      }
    });
    if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'Some lines cannot be confirmed like this', problems);

    const byProduct = new Map<number, { sku: string; line_id: number; requested: number }>();
    for (const p of plan) {
      if (p.send === 0) continue;
      const prev = byProduct.get(p.line.product_id);
      byProduct.set(p.line.product_id, { sku: p.line.sku, line_id: prev?.line_id ?? p.line.id, requested: (prev?.requested ?? 0) + p.send });
    }
    const shortfall = async () => {
      const levels = await stock.levels(trx, order.branch_id, [...byProduct.keys()]);
      return [...byProduct.entries()]
        .map(([productId, w]) => ({ ...w, available: Math.max(0, (levels.get(productId)?.on_hand ?? 0) - (levels.get(productId)?.reserved ?? 0)) }))
        .filter((w) => w.available < w.requested)
        .map((w) => ({ sku: w.sku, line_id: w.line_id, available: w.available, requested: w.requested, message: `${w.sku}: ${w.available} packs free at ${order.branch_name}, ${w.requested} asked` }));
    };
    const insufficient = (details: Awaited<ReturnType<typeof shortfall>>) =>
      AppError.conflict('insufficient_stock', `Not enough stock at ${order.branch_name} to confirm ${orderReference(order.id)}: confirm part and back-order the rest, or offer a substitute`, details);
    const short = await shortfall();
    if (short.length > 0) throw insufficient(short);
    for (const [productId, w] of byProduct) {
      if (!(await stock.reserve(trx, order.branch_id, productId, w.requested))) throw insufficient(await shortfall());
    }
    const substituted = new Set(lines.filter((l) => l.replaces_line_id !== null).map((l) => l.replaces_line_id));
    for (const p of plan) {
      const status: OrderLineStatus = p.line.status === 'substitute' ? 'substitute' : lineStatus(p.line.quantity, p.send, p.back, substituted.has(p.line.id));
      await orders.setConfirmed(trx, p.line.id, { confirmed_quantity: p.send, back_order_quantity: p.back, reserved_quantity: p.send, total: p.line.unit_price * (p.send + p.back), status });
    }
    const after = await orders.lines(id, trx);
    const subtotal = after.reduce((sum, l) => sum + l.total, 0);
    await ctx.moveStage(trx, order, 'confirm', { revision: order.revision, values: { confirmed_at: nowIso(), subtotal }, bumpRevision: true });
    await orders.supersedeOpenProposals(trx, id);
    let slotNote = '';
    if (body.slot_id) {
      const slot = await slots.book(trx, user, order, body.slot_id, await slots.loadOf(trx, order, after));
      slotNote = `; delivery booked ${slot.date} ${slot.time_window} on ${slot.registration}`;
    }
    const backOrdered = plan.reduce((sum, p) => sum + (p.back - p.line.back_order_quantity), 0);
    await orders.insertEvent(trx, id, {
      kind: 'confirmed',
      actor: actorOf(user),
      summary: `Confirmed ${plan.filter((p) => p.send > 0).length} lines from stock${backOrdered > 0 ? `, ${backOrdered} packs back-ordered` : ''}${slotNote}`,
      data: { reserved: Object.fromEntries(plan.map((p) => [p.line.sku, p.send])), back_ordered: backOrdered, ...(body.slot_id ? { slot_id: body.slot_id } : {}) },
    });
    await ctx.notify(trx, 'confirmed', id, partyOf(user));
  });
  return readOrder(ctx, user, id);
}
