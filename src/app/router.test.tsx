import { fireEvent, screen, waitFor } from '@testing-library/react';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../shared/domain/roles';
import { renderRoutes, stubFetch } from '../test-utils/render-with-providers';
import type { MockResponse } from '../test-utils/render-with-providers';
import { orderFixture, stockFixture } from '../test-utils/order-fixture';
import { PAGES } from './lazy-pages';
import { appRoutes } from './router';

// Pages load their code on first visit; loading it all once here keeps each test's waits about the
// page, not about the test runner compiling modules on the spot.
beforeAll(async () => {
  await Promise.all(Object.values(PAGES).map((load) => load()));
}, 120_000);

// Nobody signed in is an answer (200 with no session), not a failed request.
const unauthenticated = { status: 200, body: { session: null } };

function sessionFor(role: Role) {
  const merchant = role !== 'contractor_owner' && role !== 'contractor_estimator';
  return {
    user: { id: 11, email: 'sam@carnbrea-tiles.test', name: 'Sam Tregear', role },
    organisation: { id: 5, name: merchant ? 'Carnbrea Tile Supplies' : 'Polwith Roofing', kind: merchant ? 'merchant' : 'contractor' },
    calendar: { time_zone: 'Europe/London', today: '2026-12-07' },
    currency: 'GBP',
  };
}

const organisation = {
  id: 5,
  name: 'Carnbrea Tile Supplies',
  kind: 'merchant',
  branches: [{ id: 1, name: 'Carnbrea Yard', address: '2 Quarry Row', town: 'Carnbrea', phone: '01632 960 201' }],
};

function renderApp(path: string, extra: Record<string, MockResponse | MockResponse[]>) {
  const fetchMock = stubFetch({
    'GET /api/dev/outbox': { status: 200, body: { messages: [] } },
    'GET /api/organisation': { status: 200, body: organisation },
    'GET /api/members': { status: 200, body: { members: [] } },
    'GET /api/invitations': { status: 200, body: { invitations: [] } },
    ...extra,
  });
  const { router } = renderRoutes(appRoutes, { path });
  return { router, fetchMock };
}

describe('app routes', () => {
  it('sends a signed-out visitor of /team to sign in, remembering where they were going', async () => {
    const { router } = renderApp('/team', { 'GET /api/auth/session': unauthenticated });
    expect(await screen.findByRole('heading', { level: 1, name: 'Sign in' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe('?next=%2Fteam');
  });

  it.each([
    ['driver', '/driver', 'On the road'],
    ['merchant_dispatcher', '/yard', 'Yard and transport'],
    ['merchant_sales', '/desk', 'Order desk'],
    ['contractor_estimator', '/contractor', 'Estimating'],
  ] as const)('sends a signed-in %s visiting /sign-in to %s', async (role, path, heading) => {
    const { router } = renderApp('/sign-in', { 'GET /api/auth/session': { status: 200, body: { session: sessionFor(role) } } });
    expect(await screen.findByRole('heading', { level: 1, name: heading })).toBeTruthy();
    expect(router.state.location.pathname).toBe(path);
    expect(screen.getByTestId(`role-home-${role}`)).toBeTruthy();
  });

  it('shows the branches on the driver’s home from the API', async () => {
    renderApp('/driver', { 'GET /api/auth/session': { status: 200, body: { session: sessionFor('driver') } } });
    expect(await screen.findByText('Carnbrea Yard')).toBeTruthy();
    expect(screen.getByText('Hello, Sam.')).toBeTruthy();
  });

  it('moves someone on to their own home when they open another role’s home', async () => {
    const { router } = renderApp('/contractor', { 'GET /api/auth/session': { status: 200, body: { session: sessionFor('driver') } } });
    await screen.findByTestId('role-home-driver');
    expect(router.state.location.pathname).toBe('/driver');
  });

  it('refuses the team page to a driver with a 403 page', async () => {
    renderApp('/team', { 'GET /api/auth/session': { status: 200, body: { session: sessionFor('driver') } } });
    expect(await screen.findByRole('heading', { level: 1, name: 'This page is not part of your role' })).toBeTruthy();
  });

  it('shows the 404 page for an unknown address', async () => {
    renderApp('/no/such/page', { 'GET /api/auth/session': unauthenticated });
    expect(await screen.findByRole('heading', { level: 1, name: 'There is no page at this address' })).toBeTruthy();
  });

  it('signs in and honours ?next=', async () => {
    const { router } = renderApp('/sign-in?next=%2Fteam', {
      'GET /api/auth/session': unauthenticated,
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'POST /api/auth/login': { status: 200, body: sessionFor('merchant_owner') },
    });
    fireEvent.input(await screen.findByLabelText('E-mail'), { target: { value: 'sam@carnbrea-tiles.test' } });
    fireEvent.input(screen.getByLabelText('Password'), { target: { value: 'ridgeload-demo' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    // Signing in, then the team page's guard, code and data: more steps than the default wait on a busy machine.
    expect(await screen.findByRole('heading', { level: 1, name: 'Team' }, { timeout: 5_000 })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/team');
  });

  it('ignores a ?next= that points off the site', async () => {
    const { router } = renderApp('/sign-in?next=https%3A%2F%2Felsewhere.test%2F', {
      'GET /api/auth/session': unauthenticated,
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'POST /api/auth/login': { status: 200, body: sessionFor('driver') },
    });
    fireEvent.input(await screen.findByLabelText('E-mail'), { target: { value: 'sam@carnbrea-tiles.test' } });
    fireEvent.input(screen.getByLabelText('Password'), { target: { value: 'ridgeload-demo' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/driver'));
  });

  it('shows the forgotten-password confirmation in the same words whatever the server knows', async () => {
    renderApp('/forgot-password', {
      'GET /api/auth/session': unauthenticated,
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'POST /api/auth/password/forgot': { status: 202, body: { ok: true } },
    });
    fireEvent.input(await screen.findByLabelText('E-mail'), { target: { value: 'nobody@nowhere.test' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send the link' }));
    expect((await screen.findByText(/If an account uses/)).textContent).toContain('nobody@nowhere.test');
  });

  it('opens the yard’s day plan to the merchant owner from the navigation, and sends the desk home', async () => {
    const { router } = renderApp('/yard', { 'GET /api/auth/session': { status: 200, body: { session: sessionFor('merchant_owner') } } });
    expect(await screen.findByRole('heading', { level: 1, name: 'Yard and transport' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/yard');
    expect(screen.getByRole('navigation', { name: 'Main' }).querySelector('a[href="/yard"]')?.textContent).toContain('Yard day plan');
    const desk = renderApp('/yard', { 'GET /api/auth/session': { status: 200, body: { session: sessionFor('merchant_sales') } } });
    await waitFor(() => expect(desk.router.state.location.pathname).toBe('/desk'));
  });

  it('lets the yard open an order it loads, with nothing to answer, book or write', async () => {
    const order = orderFixture({
      status: 'confirmed',
      allowed_actions: ['book_slot'],
      slot: { slot_id: 21, date: '2027-03-01', time_window: '07:30-12:00', lorry: { id: 4, registration: 'TY61 KRB', has_crane: true }, driver: null, weight_kg: 2_400, pallets: 2, booked_at: '2027-02-21 10:00:00' },
    });
    renderApp('/yard/orders/1', {
      'GET /api/auth/session': { status: 200, body: { session: sessionFor('merchant_dispatcher') } },
      'GET /api/orders/1': { status: 200, body: order },
      'GET /api/branches/3/stock': { status: 200, body: { items: [stockFixture(11, 'TRS-FL420-SG', 40)] } },
    });
    expect(await screen.findByRole('heading', { level: 1, name: 'Order RL-000001' })).toBeTruthy();
    expect(await screen.findByText('Interlocking tile, slate grey')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Open the run' }).getAttribute('href')).toBe('/yard/runs/21');
    expect(screen.queryByRole('form')).toBeNull();
    expect(screen.queryByRole('button', { name: /Book this slot|Move to this slot|Add the comment|Confirm all|Offer changes|Turn down/ })).toBeNull();
  });

  it('refuses a run’s page to a contractor with a 403 page', async () => {
    renderApp('/yard/runs/7', { 'GET /api/auth/session': { status: 200, body: { session: sessionFor('contractor_owner') } } });
    expect(await screen.findByRole('heading', { level: 1, name: 'This page is not part of your role' })).toBeTruthy();
  });
});
