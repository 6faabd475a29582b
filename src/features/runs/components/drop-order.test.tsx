import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { runFixture } from '../../../test-utils/run-fixture';
import { DropOrder } from './drop-order';

const csrf = { 'GET /api/auth/csrf': { status: 200, body: { token: 't' } } };
const puts = (fetchMock: ReturnType<typeof stubFetch>) => fetchMock.mock.calls.filter(([url, init]) => String(url) === '/api/runs/7/drops' && init?.method === 'PUT').map(([, init]) => JSON.parse(String(init?.body)));
const order = () => screen.getAllByTestId('drop-row').map((row) => within(row).getByRole('link', { name: /^RL-/ }).textContent);
const href = (id: number) => `/yard/orders/${id}`;

describe('DropOrder', () => {
  it('moves a drop up with its button and saves the new order with PUT', async () => {
    const fetchMock = stubFetch({ ...csrf, 'PUT /api/runs/7/drops': { status: 200, body: {} }, 'GET /api/runs/7': { status: 200, body: runFixture() } });
    renderWithProviders(<DropOrder run={runFixture()} canReorder orderHref={href} />);
    expect(order()).toEqual(['RL-000015', 'RL-000016', 'RL-000017']);
    fireEvent.click(screen.getByRole('button', { name: 'Move RL-000017 up' }));
    expect(order()).toEqual(['RL-000015', 'RL-000017', 'RL-000016']);
    await waitFor(() => expect(puts(fetchMock)).toEqual([{ order_ids: [15, 17, 16] }]));
    expect(screen.getByText('RL-000017 is now drop 2 of 3.')).toBeTruthy();
  });

  it('moves a drop down from its focused button, keeping the focus there, and the first drop cannot go further up', async () => {
    const fetchMock = stubFetch({ ...csrf, 'PUT /api/runs/7/drops': { status: 200, body: {} }, 'GET /api/runs/7': { status: 200, body: runFixture() } });
    renderWithProviders(<DropOrder run={runFixture()} canReorder orderHref={href} />);
    const up = screen.getByRole('button', { name: 'Move RL-000015 up' });
    expect(up.getAttribute('aria-disabled')).toBe('true');
    fireEvent.click(up);
    expect(puts(fetchMock)).toEqual([]);
    const down = screen.getByRole('button', { name: 'Move RL-000015 down' });
    down.focus();
    // Enter or space on a focused button is a click; the focus stays on the button as the drop moves.
    fireEvent.click(down);
    await waitFor(() => expect(puts(fetchMock)).toEqual([{ order_ids: [16, 15, 17] }]));
    expect(document.activeElement).toBe(screen.getByRole('button', { name: 'Move RL-000015 down' }));
    expect(order()).toEqual(['RL-000016', 'RL-000015', 'RL-000017']);
  });

  it('puts the drops back and says why when the server refuses the order', async () => {
    stubFetch({
      ...csrf,
      'PUT /api/runs/7/drops': { status: 409, body: { error: { code: 'run_gone', message: 'This run has been sent out' } } },
      'GET /api/runs/7': { status: 200, body: runFixture() },
    });
    renderWithProviders(<DropOrder run={runFixture()} canReorder orderHref={href} />);
    fireEvent.click(screen.getByRole('button', { name: 'Move RL-000016 down' }));
    expect(await screen.findByText(/This run has been sent out/)).toBeTruthy();
    expect(order()).toEqual(['RL-000015', 'RL-000016', 'RL-000017']);
  });

  it('offers no moving to someone who does not load, or once the lorry has gone', () => {
    const { unmount } = renderWithProviders(<DropOrder run={runFixture()} canReorder={false} orderHref={href} />);
    expect(screen.queryByRole('button', { name: /^Move/ })).toBeNull();
    unmount();
    renderWithProviders(<DropOrder run={runFixture({ status: 'on_the_road' })} canReorder orderHref={href} />);
    expect(screen.queryByRole('button', { name: /^Move|^Drag/ })).toBeNull();
    expect(screen.getByRole('link', { name: 'RL-000016' }).getAttribute('href')).toBe('/yard/orders/16');
    expect(screen.getByRole('link', { name: 'Delivery note of RL-000016 (PDF)' }).getAttribute('href')).toBe('/api/orders/16/delivery-note.pdf');
  });
});
