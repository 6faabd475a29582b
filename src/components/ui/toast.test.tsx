import { act, fireEvent, render, screen } from '@testing-library/react';
import { createMemoryRouter, Outlet, RouterProvider, useLocation, useNavigate } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ToastOutlet, ToastProvider, useToast } from './toast';

beforeEach(() => {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date(2027, 2, 10, 9, 0));
});
afterEach(() => vi.useRealTimers());

function Layout() {
  const location = useLocation();
  return (
    <main>
      <ToastOutlet pageKey={location.pathname} />
      <Outlet />
    </main>
  );
}

function EstimatePage() {
  const toast = useToast();
  const navigate = useNavigate();
  return (
    <>
      <button type="button" onClick={() => toast.show('Estimate 5 saved.', 'success')}>
        Save the estimate
      </button>
      <button type="button" onClick={() => void navigate('/faces')}>
        Open the faces
      </button>
      <button
        type="button"
        onClick={() => {
          toast.show('Estimate 6 saved.', 'success');
          void navigate('/faces');
        }}
      >
        Save and open the faces
      </button>
    </>
  );
}

function renderApp() {
  const router = createMemoryRouter(
    [
      {
        element: <Layout />,
        children: [
          { path: '/', element: <EstimatePage /> },
          { path: '/faces', element: <p>Rafter 5,000 mm</p> },
        ],
      },
    ],
    { initialEntries: ['/'] },
  );
  render(
    <ToastProvider>
      <RouterProvider router={router} />
    </ToastProvider>,
  );
}

describe('notices on a page', () => {
  it('sit in the page’s flow, never over its content', () => {
    renderApp();
    fireEvent.click(screen.getByRole('button', { name: 'Save the estimate' }));
    const regions = screen.getAllByRole('region', { name: 'Notifications' });
    expect(regions).toHaveLength(1);
    expect(regions[0].className).not.toMatch(/\b(fixed|absolute|sticky)\b/);
    expect(regions[0].closest('main')).not.toBeNull();
    expect(regions[0].textContent).toContain('Estimate 5 saved.');
  });

  it('go with their page: a note shown a while ago is gone on the next page', async () => {
    renderApp();
    fireEvent.click(screen.getByRole('button', { name: 'Save the estimate' }));
    vi.setSystemTime(new Date(2027, 2, 10, 9, 0, 5));
    await act(async () => fireEvent.click(screen.getByRole('button', { name: 'Open the faces' })));
    expect(await screen.findByText('Rafter 5,000 mm')).toBeTruthy();
    expect(screen.queryByText('Estimate 5 saved.')).toBeNull();
  });

  it('keep a note that says what led to the page change', async () => {
    renderApp();
    await act(async () => fireEvent.click(screen.getByRole('button', { name: 'Save and open the faces' })));
    expect(await screen.findByText('Rafter 5,000 mm')).toBeTruthy();
    expect(screen.getByText('Estimate 6 saved.')).toBeTruthy();
  });
});
