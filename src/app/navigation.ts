import { can } from '../../shared/domain/policy';
import type { Action } from '../../shared/domain/policy';
import type { Role } from '../../shared/domain/roles';
import type { NavItem } from '../components/layout/app-shell';
import { homePathForRole } from './home-path';

interface SectionEntry extends NavItem {
  /** The policy action a role needs to use the page; the link shows only to roles that have it. */
  action: Action;
}

const SECTIONS: readonly SectionEntry[] = [
  // TODO: give sites, orders and quotes their own icons when nav-icon.tsx next changes.
  { to: '/sites', label: 'Sites', icon: 'branches', action: 'projects:read' },
  { to: '/orders', label: 'Orders', icon: 'organisation', action: 'orders:place' },
  { to: '/quotes', label: 'Quotes', icon: 'organisation', action: 'orders:place' },
  { to: '/desk/orders', label: 'Order book', icon: 'organisation', action: 'orders:confirm' },
  { to: '/desk/quotes', label: 'Quote requests', icon: 'organisation', action: 'orders:confirm' },
  { to: '/yard', label: 'Yard day plan', icon: 'branches', action: 'fleet:manage' },
  { to: '/fleet', label: 'Lorries and slots', icon: 'branches', action: 'fleet:manage' },
  { to: '/catalogue', label: 'Catalogue', icon: 'branches', action: 'catalogue:read' },
  { to: '/invoices', label: 'Invoices', icon: 'organisation', action: 'invoices:read' },
  { to: '/accounts', label: 'Accounts', icon: 'organisation', action: 'accounts:manage' },
  { to: '/organisation', label: 'Organisation', icon: 'organisation', action: 'organisation:read' },
  { to: '/branches', label: 'Branches', icon: 'branches', action: 'branches:read' },
  { to: '/team', label: 'Team', icon: 'team', action: 'members:read' },
];

/** The navigation a role sees: its home, then every section the policy lets it read (its home only once). */
export function navItemsForRole(role: Role): NavItem[] {
  const home = homePathForRole(role);
  return [
    { to: home, label: 'Home', icon: 'home' },
    ...SECTIONS.filter((section) => section.to !== home && can(role, section.action)).map(({ to, label, icon }) => ({ to, label, icon })),
  ];
}

/** The action each section's route requires; the route guard and the navigation share it. */
export function actionForSection(path: string): Action | undefined {
  return SECTIONS.find((section) => section.to === path)?.action;
}
