import { can } from '../../../../shared/domain/policy';
import type { Role } from '../../../../shared/domain/roles';
import type { RunAbilities } from '../components/run-detail';

/**
 * What a role may do on a run's page. The yard (lorries and their loads: `fleet:manage`, the
 * dispatcher and the merchant owner) ticks pallets, orders the drops, sends the lorry out and may
 * override; the desk sees the same run read-only. The server checks each again.
 */
export function runAbilitiesFor(role: Role): RunAbilities {
  const yard = can(role, 'fleet:manage');
  return { build: yard, sendOut: yard, override: yard };
}

/** Where an order opens for the role: the desk's own page, or the yard's read-only one. */
export function orderHrefFor(role: Role): (orderId: number) => string {
  return can(role, 'orders:confirm') ? (id) => `/desk/orders/${id}` : (id) => `/yard/orders/${id}`;
}
