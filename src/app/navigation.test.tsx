import { fireEvent, screen, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { ROLES } from '../../shared/domain/roles';
import { can } from '../../shared/domain/policy';
import { AppShell } from '../components/layout/app-shell';
import { cleanup } from '@testing-library/react';
import { renderWithProviders } from '../test-utils/render-with-providers';
import { navItemsForRole } from './navigation';
import type { Role } from '../../shared/domain/roles';

function renderShellFor(role: Role) {
  renderWithProviders(
    <AppShell navItems={navItemsForRole(role)} homePath="/" person={{ name: 'Kit Trelawny', roleLabel: role, organisationName: 'Carn Tile Supplies' }} onSignOut={vi.fn()}>
      <p>page</p>
    </AppShell>,
  );
  return within(screen.getByRole('navigation', { name: 'Main' }));
}

describe('role-aware navigation', () => {
  it('shows a driver no Team link, but Home and Branches', () => {
    const nav = renderShellFor('driver');
    expect(nav.queryByRole('link', { name: 'Team' })).toBeNull();
    expect(nav.getByRole('link', { name: 'Home' }).getAttribute('href')).toBe('/driver');
    expect(nav.getByRole('link', { name: 'Branches' })).toBeTruthy();
  });

  it('shows a contractor owner the Team link and no Branches link', () => {
    const nav = renderShellFor('contractor_owner');
    expect(nav.getByRole('link', { name: 'Team' }).getAttribute('href')).toBe('/team');
    expect(nav.queryByRole('link', { name: 'Branches' })).toBeNull();
  });

  it('shows a merchant owner Team and Branches', () => {
    const nav = renderShellFor('merchant_owner');
    expect(nav.getByRole('link', { name: 'Team' })).toBeTruthy();
    expect(nav.getByRole('link', { name: 'Branches' })).toBeTruthy();
  });

  it('offers each role exactly the sections the policy lets it read', () => {
    for (const role of ROLES) {
      const labels = navItemsForRole(role).map((item) => item.label);
      expect(labels.includes('Team')).toBe(can(role, 'members:read'));
      expect(labels.includes('Branches')).toBe(can(role, 'branches:read'));
      expect(labels.includes('Organisation')).toBe(can(role, 'organisation:read'));
    }
  });

  it('offers the yard day plan to the merchant owner, and to the dispatcher only once, as Home', () => {
    expect(navItemsForRole('merchant_owner').find((i) => i.to === '/yard')?.label).toBe('Yard day plan');
    const yard = navItemsForRole('merchant_dispatcher').filter((i) => i.to === '/yard');
    expect(yard.map((i) => i.label)).toEqual(['Home']);
    expect(navItemsForRole('merchant_sales').some((i) => i.to === '/yard')).toBe(false);
  });

  it('gives every link a picture of what its page is, hidden from screen readers, beside its label', () => {
    for (const role of ROLES) {
      cleanup();
      const nav = renderShellFor(role);
      for (const item of navItemsForRole(role)) {
        const link = nav.getByRole('link', { name: item.label });
        const icon = link.querySelector('svg');
        expect(icon?.getAttribute('aria-hidden'), `${role}: ${item.label}`).toBe('true');
        expect(icon?.getAttribute('data-icon')).toBe(item.icon);
        expect(link.textContent).toBe(item.label);
      }
    }
  });

  it('gives different pages different icons, and only the home the house', () => {
    for (const role of ROLES) {
      const items = navItemsForRole(role);
      const byIcon = new Map<string, string[]>();
      for (const item of items) byIcon.set(item.icon, [...(byIcon.get(item.icon) ?? []), item.to]);
      for (const [icon, paths] of byIcon) expect(paths, `${role}: ${icon}`).toHaveLength(1);
      expect(items.filter((item) => item.icon === 'home').map((item) => item.label)).toEqual(['Home']);
    }
  });

  it('can fetch the page behind every link ahead of a click, and does so when the link is pointed at or focused', () => {
    for (const role of ROLES) {
      for (const item of navItemsForRole(role)) expect(item.prefetch, `${role}: ${item.to}`).toBeTypeOf('function');
    }
    const prefetch = vi.fn();
    renderWithProviders(
      <AppShell navItems={[{ to: '/team', label: 'Team', icon: 'team', prefetch }]} homePath="/" person={{ name: 'Kit Trelawny', roleLabel: 'Owner', organisationName: 'Carn Tile Supplies' }} onSignOut={vi.fn()}>
        <p>page</p>
      </AppShell>,
    );
    const links = screen.getAllByRole('link', { name: 'Team', hidden: true });
    fireEvent.pointerEnter(links[0]);
    fireEvent.focus(links[links.length - 1]);
    expect(prefetch).toHaveBeenCalledTimes(2);
  });
});
