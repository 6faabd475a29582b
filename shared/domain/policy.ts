import type { Role } from './roles';

/**
 * The one table of who may do what. Every API route names one of these actions (or says it is
 * public / needs only a signed-in user); the client uses the same table to shape navigation.
 * Tenancy (which records) is enforced separately, in the repositories.
 */
export const POLICY = {
  'organisation:read': ['contractor_owner', 'contractor_estimator', 'merchant_owner', 'merchant_sales', 'merchant_dispatcher', 'driver'],
  'organisation:update': ['contractor_owner', 'merchant_owner'],
  'members:read': ['contractor_owner', 'contractor_estimator', 'merchant_owner', 'merchant_sales', 'merchant_dispatcher'],
  'members:manage': ['contractor_owner', 'merchant_owner'],
  'branches:read': ['merchant_owner', 'merchant_sales', 'merchant_dispatcher', 'driver'],
  'branches:manage': ['merchant_owner'],
  'projects:read': ['contractor_owner', 'contractor_estimator'],
  'projects:write': ['contractor_owner', 'contractor_estimator'],
  'estimates:read': ['contractor_owner', 'contractor_estimator'],
  'estimates:write': ['contractor_owner', 'contractor_estimator'],
  'systems:read': ['contractor_owner', 'contractor_estimator', 'merchant_owner', 'merchant_sales'],
  'orders:read': ['contractor_owner', 'contractor_estimator', 'merchant_owner', 'merchant_sales', 'merchant_dispatcher'],
  'orders:place': ['contractor_owner', 'contractor_estimator'],
  'orders:respond': ['contractor_owner', 'contractor_estimator'],
  'orders:confirm': ['merchant_owner', 'merchant_sales'],
  'catalogue:read': ['merchant_owner', 'merchant_sales', 'merchant_dispatcher'],
  'catalogue:manage': ['merchant_owner', 'merchant_sales'],
  'stock:manage': ['merchant_owner', 'merchant_sales', 'merchant_dispatcher'],
  'fleet:manage': ['merchant_owner', 'merchant_dispatcher'],
  'slots:read': ['merchant_owner', 'merchant_sales', 'merchant_dispatcher'],
  'slots:book': ['merchant_owner', 'merchant_sales', 'merchant_dispatcher'],
  'deliveries:read': ['merchant_owner', 'merchant_dispatcher', 'driver'],
  'deliveries:record': ['driver', 'merchant_dispatcher'],
  'invoices:read': ['contractor_owner', 'contractor_estimator', 'merchant_owner', 'merchant_sales'],
  'invoices:issue': ['merchant_owner', 'merchant_sales'],
  'payments:make': ['contractor_owner', 'contractor_estimator'],
  'orders:comment': ['contractor_owner', 'contractor_estimator', 'merchant_owner', 'merchant_sales', 'merchant_dispatcher'],
  'accounts:manage': ['merchant_owner', 'merchant_sales'],
  // Runs: the yard's day. A driver reads only the runs assigned to them (checked in the service).
  'runs:read': ['merchant_owner', 'merchant_sales', 'merchant_dispatcher', 'driver'],
  'runs:plan': ['merchant_owner', 'merchant_sales', 'merchant_dispatcher'],
  'runs:load': ['merchant_owner', 'merchant_dispatcher'],
  'runs:send_out': ['merchant_owner', 'merchant_sales', 'merchant_dispatcher'],
  /** Sending a run out before its day or with a pallet not ticked loaded, with a reason. */
  'runs:override': ['merchant_owner', 'merchant_dispatcher'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof POLICY;

export function can(role: Role, action: Action): boolean {
  return (POLICY[action] as readonly Role[]).includes(role);
}
