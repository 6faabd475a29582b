import { fireEvent, screen, waitFor } from '@testing-library/react';
import { act } from 'react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { stubFetch } from '../test-utils/render-with-providers';
import { startApp } from './app-start';
import { startSignIn } from './sign-in-start';

// The whole app is what the sign-in page hands over to; here only the hand-over itself is watched.
vi.mock('./app-start', () => ({ startApp: vi.fn() }));

const session = {
  user: { id: 4, email: 'ada@ridge-roofing.test', name: 'Ada Penhallow', role: 'contractor_owner' },
  organisation: { id: 2, name: 'Penhallow Roofing', kind: 'contractor' },
  calendar: { time_zone: 'Europe/London', today: '2026-12-07' },
  currency: 'GBP',
};

let container: HTMLElement;

beforeEach(() => {
  // This page renders into a root of its own, as in the browser, rather than through Testing Library's render.
  (globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;
  container = document.body.appendChild(document.createElement('div'));
  vi.mocked(startApp).mockClear();
});

afterEach(() => {
  container.remove();
  window.history.replaceState(null, '', '/');
});

async function open(path: string) {
  window.history.replaceState(null, '', path);
  await act(() => startSignIn(container));
}

describe('the sign-in page opened first, before the app has loaded', () => {
  it('shows the form when nobody is signed in, and on signing in opens the address it was sent from in the app, with the session', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/session': { status: 200, body: { session: null } },
      'GET /api/dev/outbox': { status: 404 },
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf-1' } },
      'POST /api/auth/login': { status: 200, body: session },
    });
    await open('/sign-in?next=%2Fsites%2F3');

    expect(await screen.findByRole('heading', { level: 1, name: 'Sign in' })).toBeTruthy();
    expect(screen.getByText('Sign in to carry on where you were.')).toBeTruthy();
    fireEvent.input(screen.getByLabelText('E-mail'), { target: { value: 'ada@ridge-roofing.test' } });
    fireEvent.input(screen.getByLabelText('Password'), { target: { value: 'ridgeload-demo' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    await waitFor(() => expect(startApp).toHaveBeenCalledTimes(1));
    expect(vi.mocked(startApp).mock.calls[0][1]).toEqual({ session });
    expect(`${window.location.pathname}${window.location.search}`).toBe('/sites/3');
    // The session was asked once, before the form showed; the app is given it rather than asking again.
    expect(fetchMock.mock.calls.filter((call) => call[0] === '/api/auth/session')).toHaveLength(1);
  });

  it('opens a link of the page in the app, at that address, knowing nobody is signed in', async () => {
    stubFetch({ 'GET /api/auth/session': { status: 200, body: { session: null } }, 'GET /api/dev/outbox': { status: 404 } });
    await open('/sign-in');

    fireEvent.click(await screen.findByRole('link', { name: 'Forgotten your password?' }));

    await waitFor(() => expect(startApp).toHaveBeenCalledTimes(1));
    expect(vi.mocked(startApp).mock.calls[0][1]).toEqual({ session: null });
    expect(window.location.pathname).toBe('/forgot-password');
  });

  it('sends someone already signed in straight on to their home, without showing the form', async () => {
    stubFetch({ 'GET /api/auth/session': { status: 200, body: { session: { ...session, user: { ...session.user, role: 'driver' } } } } });
    await open('/sign-in');

    await waitFor(() => expect(startApp).toHaveBeenCalledTimes(1));
    expect(window.location.pathname).toBe('/driver');
    expect(screen.queryByRole('heading', { name: 'Sign in' })).toBeNull();
  });
});
