import type { ReactNode } from 'react';
import type { Role } from '../../../shared/domain/roles';

interface RoleHomeProps {
  role: Role;
  children: ReactNode;
}

/** The wrapper of every role home; browser tests find the landing page by its test id. */
export function RoleHome({ role, children }: RoleHomeProps) {
  return <div data-testid={`role-home-${role}`}>{children}</div>;
}
