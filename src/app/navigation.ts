import { can } from '../../shared/domain/policy';
import type { Action } from '../../shared/domain/policy';
import type { Role } from '../../shared/domain/roles';
import type { NavItem } from '../components/layout/app-shell';
import { homePathForRole } from './home-path';
import { hasPrefetch, prefetchPage } from './lazy-pages';

interface SectionEntry extends NavItem {
  /** The policy action a role needs to use the page; the link shows only to roles that have it. */
  action: Action;
}

const SECTIONS: readonly SectionEntry[] = [
  { to: '/sites', label: 'Sites', icon: 'sites', action: 'projects:read' },
  { to: '/orders', label: 'Orders', icon: 'orders', action: 'orders:place' },
  { to: '/quotes', label: 'Quotes', icon: 'quotes', action: 'orders:place' },
  { to: '/desk/orders', label: 'Order book', icon: 'orderBook', action: 'orders:confirm' },
  { to: '/desk/quotes', label: 'Quote requests', icon: 'quotes', action: 'orders:confirm' },
  { to: '/yard', label: 'Yard day plan', icon: 'yard', action: 'fleet:manage' },
  { to: '/fleet', label: 'Lorries and slots', icon: 'fleet', action: 'fleet:manage' },
  { to: '/catalogue', label: 'Catalogue', icon: 'catalogue', action: 'catalogue:read' },
  { to: '/invoices', label: 'Invoices', icon: 'invoices', action: 'invoices:read' },
  { to: '/accounts', label: 'Accounts', icon: 'accounts', action: 'accounts:manage' },
  { to: '/organisation', label: 'Organisation', icon: 'organisation', action: 'organisation:read' },
  { to: '/branches', label: 'Branches', icon: 'branches', action: 'branches:read' },
  { to: '/team', label: 'Team', icon: 'team', action: 'members:read' },
];

/** A link's page code starts loading when the link is pointed at or focused (src/app/lazy-pages.tsx). */
function withPrefetch(item: NavItem): NavItem {
  return hasPrefetch(item.to) ? { ...item, prefetch: () => prefetchPage(item.to) } : item;
}

/** The navigation a role sees: its home, then every section the policy lets it read (its home only once). */
export function navItemsForRole(role: Role): NavItem[] {
  const home = homePathForRole(role);
  return [{ to: home, label: 'Home', icon: 'home' as const }, ...SECTIONS.filter((section) => section.to !== home && can(role, section.action)).map(({ to, label, icon }) => ({ to, label, icon }))].map(withPrefetch);
}

/** The action each section's route requires; the route guard and the navigation share it. */
export function actionForSection(path: string): Action | undefined {
  return SECTIONS.find((section) => section.to === path)?.action;
}
