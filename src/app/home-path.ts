import type { Role } from '../../shared/domain/roles';

/** Where each role starts after signing in. */
export const ROLE_HOME_PATHS = {
  contractor_owner: '/contractor',
  contractor_estimator: '/contractor',
  merchant_owner: '/desk',
  merchant_sales: '/desk',
  merchant_dispatcher: '/yard',
  driver: '/driver',
} as const satisfies Record<Role, string>;

export function homePathForRole(role: Role): string {
  return ROLE_HOME_PATHS[role];
}

/**
 * The `next` address a sign-in may return to, or null. Only paths inside this app count, so a
 * crafted link cannot send someone to another site after they type their password.
 */
export function safeNextPath(next: string | null | undefined): string | null {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return null;
  if (next === '/sign-in' || next.startsWith('/sign-in?') || next.startsWith('/sign-in/')) return null;
  return next;
}
