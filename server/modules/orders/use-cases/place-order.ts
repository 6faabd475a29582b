import type { z } from 'zod';
import type { placeOrderBodySchema } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import type { Db } from '../../../db/knex';
import { nowIso } from '../../../db/time';
import { AppError } from '../../../http/app-error';
import type { NewOrderLine } from '../orders.repository';
import { actorOf, assertCraneAllowed, assertNotPast, invalid, newLine, partyOf, type OrderContext } from './order-context';
import { orderSiteOf } from '../../projects/order-site';
import { readOrder } from './read-order';

type PlaceBody = z.output<typeof placeOrderBodySchema>;

/**
 * Sends an order to one branch, from an estimate: its lines as they are, or lines adjusted before
 * sending. Prices are the branch's prices today; the site is copied as it stands.
 */
export async function placeOrder(
  ctx: OrderContext,
  user: AuthUser,
  body: PlaceBody,
  from: { quoteId?: number; lines?: NewOrderLine[]; /** Runs in the order's own transaction. */ alsoInTransaction?: (trx: Db, orderId: number) => Promise<void> } = {},
) {
  const { db, deps, estimates, projects, catalogue, orders } = ctx;
  const estimate = await estimates.find(user.organisation.id, body.estimate_id);
  if (!estimate) throw invalid('estimate_id', 'is not an estimate of yours');
  await projects.requireOpen(user, estimate.project_id);
  const branch = (await catalogue.branchesByIds([body.branch_id])).get(body.branch_id);
  if (!branch) throw invalid('branch_id', 'is not a merchant branch');
  assertNotPast(deps.config.calendar, body.requested_date, 'requested_date');
  const site = orderSiteOf(await projects.get(user, estimate.project_id));
  assertCraneAllowed(body.delivery_method, site, 'delivery_method');

  let lines: NewOrderLine[];
  if (from.lines) {
    lines = from.lines;
  } else if (body.lines) {
    lines = await ctx.priceLines(branch.id, branch.name, body.lines, (i) => `lines.${i}.product_id`);
  } else {
    const estimateLines = await estimates.lines(estimate.id);
    const withProducts = estimateLines.filter((l) => l.product_id !== null);
    if (withProducts.length === 0) throw invalid('lines', 'this estimate has no merchant products: give the lines to order, or ask branches for a quote');
    const sold = await catalogue.branchProducts(
      branch.id,
      withProducts.map((l) => l.product_id!),
    );
    const missing = withProducts.filter((l) => !sold.has(l.product_id!));
    if (missing.length > 0) {
      throw AppError.unprocessable(
        'validation_failed',
        `${branch.name} does not sell every product of this estimate`,
        missing.map((l) => ({ path: 'branch_id', message: `${branch.name} does not sell ${l.sku} (${l.description}): adjust the lines or ask for a quote` })),
      );
    }
    lines = withProducts.map((l) => newLine(sold.get(l.product_id!)!, l.packs, 'asked'));
  }
  const subtotal = lines.reduce((s, l) => s + l.total, 0);
  const id = await db.transaction(async (trx) => {
    const orderId = await orders.insertOrder(
      trx,
      {
        contractor_organisation_id: user.organisation.id,
        merchant_organisation_id: branch.merchant.id,
        branch_id: branch.id,
        project_id: estimate.project_id,
        estimate_id: estimate.id,
        quote_id: from.quoteId ?? null,
        status: 'sent',
        requested_date: body.requested_date,
        time_window: body.time_window ?? null,
        delivery_method: body.delivery_method,
        po_reference: body.po_reference ?? '',
        notes: body.notes ?? '',
        site_name: site.name,
        site,
        subtotal,
        placed_by: user.id,
        placed_at: nowIso(),
      },
      lines,
    );
    await orders.insertEvent(trx, orderId, {
      kind: 'placed',
      actor: actorOf(user),
      summary: `Sent to ${branch.name}: ${lines.length} lines for ${body.requested_date}${body.time_window ? ` ${body.time_window}` : ''}`,
      data: { lines: lines.length, subtotal, ...(from.quoteId ? { quote_id: from.quoteId } : {}) },
    });
    if (from.alsoInTransaction) await from.alsoInTransaction(trx, orderId);
    await ctx.notify(trx, 'placed', orderId, partyOf(user));
    return orderId;
  });
  return readOrder(ctx, user, id);
}
