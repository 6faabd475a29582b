import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { loadedRunFixture, runFixture } from '../../../test-utils/run-fixture';
import { SendOutPanel } from './send-out-panel';

const csrf = { 'GET /api/auth/csrf': { status: 200, body: { token: 't' } } };
const posts = (fetchMock: ReturnType<typeof stubFetch>) =>
  fetchMock.mock.calls.filter(([url, init]) => String(url) === '/api/runs/7/send-out' && init?.method === 'POST').map(([, init]) => JSON.parse(String(init?.body)));

/** The firm's clock: 09:00 in London on the given day (the fixtures' run is for Monday 2027-03-01). */
function todayIs(date: string) {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date(`${date}T09:00:00Z`));
}

beforeEach(() => todayIs('2027-03-01'));
afterEach(() => vi.useRealTimers());

describe('SendOutPanel', () => {
  it('hides Send out before the run’s day, saying why, even with every pallet loaded', () => {
    todayIs('2027-02-26');
    renderWithProviders(<SendOutPanel run={loadedRunFixture()} canSendOut canOverride={false} />);
    expect(screen.queryByRole('button', { name: /^Send out/ })).toBeNull();
    const why = screen.getByRole('list', { name: 'Why it cannot go yet' });
    expect(
      within(why)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual(['Not before its day: this run is for Mon 1 Mar 2027 and today is Fri 26 Feb 2027.']);
  });

  it('hides Send out on the day while a pallet is not loaded, saying how many', () => {
    const loaded = loadedRunFixture();
    const run = { ...loaded, loaded_count: 5, deck: { ...loaded.deck, positions: loaded.deck.positions.map((p, i) => (i === 4 ? { ...p, loaded: false } : p)) } };
    renderWithProviders(<SendOutPanel run={run} canSendOut canOverride={false} />);
    expect(screen.queryByRole('button', { name: /^Send out/ })).toBeNull();
    expect(screen.getByText('1 pallet of 6 is not ticked loaded yet.')).toBeTruthy();
    expect(screen.queryByText(/its day/)).toBeNull();
  });

  it('gives both reasons after the day with nothing loaded', () => {
    todayIs('2027-03-02');
    renderWithProviders(<SendOutPanel run={runFixture()} canSendOut canOverride={false} />);
    expect(screen.getByText('Its day has passed: this run was for Mon 1 Mar 2027 and today is Tue 2 Mar 2027.')).toBeTruthy();
    expect(screen.getByText('6 pallets of 6 are not ticked loaded yet.')).toBeTruthy();
  });

  it('offers Send out on the day with every pallet loaded, and posts it with no override', async () => {
    const fetchMock = stubFetch({ ...csrf, 'POST /api/runs/7/send-out': { status: 200, body: {} }, 'GET /api/runs/7': { status: 200, body: loadedRunFixture() } });
    renderWithProviders(<SendOutPanel run={loadedRunFixture()} canSendOut canOverride />);
    expect(screen.queryByRole('list', { name: 'Why it cannot go yet' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Send out anyway…' })).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'Send out TY61 KRB' }));
    await waitFor(() => expect(posts(fetchMock)).toEqual([{}]));
    expect(await screen.findByText('TY61 KRB is on the road.')).toBeTruthy();
  });

  it('shows the server’s 409 when the send-out is refused', async () => {
    stubFetch({
      ...csrf,
      'POST /api/runs/7/send-out': { status: 409, body: { error: { code: 'not_loaded', message: 'Pallet 3 of RL-000015 is not loaded' } } },
      'GET /api/runs/7': { status: 200, body: loadedRunFixture() },
    });
    renderWithProviders(<SendOutPanel run={loadedRunFixture()} canSendOut canOverride />);
    fireEvent.click(screen.getByRole('button', { name: 'Send out TY61 KRB' }));
    const alert = await screen.findByRole('alert');
    expect(within(alert).getByText('Pallet 3 of RL-000015 is not loaded')).toBeTruthy();
  });

  it('checks the override’s reason before sending, then sends it, and shows a 409 from the server', async () => {
    const fetchMock = stubFetch({
      ...csrf,
      'POST /api/runs/7/send-out': { status: 409, body: { error: { code: 'not_today', message: 'This run is for 1 March 2027; today is 26 February 2027' } } },
      'GET /api/runs/7': { status: 200, body: runFixture() },
    });
    todayIs('2027-02-26');
    renderWithProviders(<SendOutPanel run={runFixture()} canSendOut canOverride />);
    fireEvent.click(screen.getByRole('button', { name: 'Send out anyway…' }));
    const form = await screen.findByRole('form', { name: 'Send out anyway' });
    expect(form.textContent).toContain('not its day and not every pallet ticked');
    const reason = within(form).getByLabelText('Reason for sending out anyway');
    fireEvent.click(within(form).getByRole('button', { name: 'Send out with this reason' }));
    expect(await within(form).findByText('Say why in a few words (at least 3 letters)')).toBeTruthy();
    expect(reason.getAttribute('aria-invalid')).toBe('true');
    expect(document.getElementById(reason.getAttribute('aria-describedby')!)?.textContent).toContain('Say why in a few words');
    fireEvent.input(reason, { target: { value: '  ok ' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Send out with this reason' }));
    expect(await within(form).findByText('Say why in a few words (at least 3 letters)')).toBeTruthy();
    fireEvent.input(reason, { target: { value: 'x'.repeat(501) } });
    fireEvent.click(within(form).getByRole('button', { name: 'Send out with this reason' }));
    expect(await within(form).findByText('Keep the reason to 500 characters')).toBeTruthy();
    expect(posts(fetchMock)).toEqual([]);
    fireEvent.input(reason, { target: { value: ' Site asked for it a day early ' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Send out with this reason' }));
    await waitFor(() => expect(posts(fetchMock)).toEqual([{ override_reason: 'Site asked for it a day early' }]));
    expect(await within(form).findByText('This run is for 1 March 2027; today is 26 February 2027')).toBeTruthy();
  });

  it('puts a 422 about the reason on the reason box, linked by aria-describedby and focused', async () => {
    stubFetch({
      ...csrf,
      'POST /api/runs/7/send-out': {
        status: 422,
        body: { error: { code: 'validation_failed', message: 'Some fields are not valid', details: [{ path: 'override_reason', message: 'must not name a customer’s card' }] } },
      },
      'GET /api/runs/7': { status: 200, body: runFixture() },
    });
    todayIs('2027-02-26');
    renderWithProviders(<SendOutPanel run={runFixture()} canSendOut canOverride />);
    fireEvent.click(screen.getByRole('button', { name: 'Send out anyway…' }));
    const form = await screen.findByRole('form', { name: 'Send out anyway' });
    const reason = within(form).getByLabelText('Reason for sending out anyway');
    fireEvent.input(reason, { target: { value: 'Site asked for it a day early' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Send out with this reason' }));
    await waitFor(() => expect(reason.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(reason.getAttribute('aria-describedby')!)?.textContent).toContain('must not name a customer’s card');
    expect(document.activeElement).toBe(reason);
  });

  it('offers no override to someone who may not give one, and none once the lorry has gone', () => {
    todayIs('2027-02-26');
    const { unmount } = renderWithProviders(<SendOutPanel run={runFixture()} canSendOut canOverride={false} />);
    expect(screen.queryByRole('button', { name: 'Send out anyway…' })).toBeNull();
    unmount();
    renderWithProviders(<SendOutPanel run={loadedRunFixture({ status: 'on_the_road', dispatched_at: '2027-03-01T07:42:00Z' })} canSendOut canOverride />);
    expect(screen.queryByRole('button', { name: /Send out/ })).toBeNull();
    expect(screen.getByTestId('send-out').textContent).toMatch(/^On the road since/);
  });
});
