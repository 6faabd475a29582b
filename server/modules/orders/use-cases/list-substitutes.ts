import type { SubstituteOptions } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import { substituteOptions } from '../substitutes';
import { partyOf, type OrderContext } from './order-context';

/** What the desk may offer instead of one line, each with its quantity and, for a tile, the engine's figures. */
export async function listSubstitutes(ctx: OrderContext, user: AuthUser, id: number, lineId: number): Promise<SubstituteOptions> {
  const { db, orders, catalogue } = ctx;
  if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
  const order = await orders.find(partyOf(user), id);
  if (!order) throw AppError.notFound('Order');
  const lines = await orders.lines(id);
  const line = lines.find((l) => l.id === lineId && l.status !== 'substitute');
  if (!line) throw AppError.notFound('Order line');
  const candidates = await catalogue.branchProducts(order.branch_id, { category: line.category });
  return { line_id: line.id, options: await substituteOptions(db, order, lines, line, [...candidates.values()]) };
}
