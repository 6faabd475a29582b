import { can } from '../../../../shared/domain/policy';
import type { Role } from '../../../../shared/domain/roles';
import type { RunAbilities } from '../components/run-detail';

/** What a role may do on a run's page, from the shared policy; the server checks each again. */
export function runAbilitiesFor(role: Role): RunAbilities {
  return { plan: can(role, 'runs:plan'), load: can(role, 'runs:load'), sendOut: can(role, 'runs:send_out'), override: can(role, 'runs:override') };
}

/** Where an order opens for the role: the desk's own page, or the yard's read-only one. */
export function orderHrefFor(role: Role): (orderId: number) => string {
  return can(role, 'orders:confirm') ? (id) => `/desk/orders/${id}` : (id) => `/yard/orders/${id}`;
}
