import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { OrderDetail } from '../../../../shared/schemas/order.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { deskKeys } from '../api/keys';
import { orderFixture, stockFixture } from '../../../test-utils/order-fixture';
import { DeskOrderDetail } from './desk-order-detail';
import { FollowUpPanel } from './follow-up-panel';

// Only Date is faked, so "today" is fixed while the testing library's timers run as usual.
beforeEach(() => {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date(2027, 2, 10, 9, 0));
});
afterEach(() => {
  vi.useRealTimers();
});

/** A confirmed order with 4 tiles and 2 ridges back-ordered, 1 ridge line sent in full. */
function confirmedWithBackOrder(overrides: Partial<OrderDetail> = {}): OrderDetail {
  const base = orderFixture();
  const [tiles, ridge] = base.lines;
  return orderFixture({
    status: 'confirmed',
    status_label: 'Confirmed',
    time_window: '07:30-12:00',
    allowed_actions: ['start_follow_up'],
    lines: [
      { ...tiles, confirmed_quantity: 6, back_order_quantity: 4, reserved_quantity: 6, status: 'part_agreed' },
      { ...ridge, confirmed_quantity: 5, back_order_quantity: 0, reserved_quantity: 5, status: 'agreed' },
      { ...ridge, id: 103, position: 3, product_id: 14, sku: 'TRS-DVR-SG', description: 'Dry verge unit, slate grey', quantity: 8, confirmed_quantity: 6, back_order_quantity: 2, status: 'part_agreed' },
    ],
    back_ordered_packs: 6,
    ...overrides,
  });
}

const followUp = () =>
  orderFixture({
    id: 7,
    reference: 'RL-000007',
    status: 'agreed',
    status_label: 'Changes agreed, waiting for confirmation',
    allowed_actions: ['confirm', 'offer_changes', 'turn_down'],
    follows: { id: 1, reference: 'RL-000001', status: 'confirmed', status_label: 'Confirmed' },
  });

const CSRF = { 'GET /api/auth/csrf': { status: 200, body: { token: 't' } } };
const submit = () => fireEvent.click(screen.getByRole('button', { name: 'Start the follow-up order' }));
const dateInput = () => screen.getByLabelText('Day wanted') as HTMLInputElement;
const sentBody = (fetchMock: ReturnType<typeof stubFetch>) => {
  const call = fetchMock.mock.calls.find(([url, init]) => String(url).endsWith('/api/orders/1/follow-up') && init?.method === 'POST');
  return call ? (JSON.parse(String(call[1]?.body)) as unknown) : undefined;
};

describe('FollowUpPanel', () => {
  it('lists only the lines with packs to follow, with SKU, item and packs', () => {
    stubFetch({});
    renderWithProviders(<FollowUpPanel order={confirmedWithBackOrder()} />);
    const table = screen.getByRole('table', { name: 'Packs still to follow, per line' });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(
      rows.map((r) =>
        within(r)
          .getAllByRole('cell')
          .map((c) => c.textContent),
      ),
    ).toEqual([
      ['TRS-FL420-SG', 'Interlocking tile, slate grey', '4'],
      ['TRS-DVR-SG', 'Dry verge unit, slate grey', '2'],
    ]);
    expect(screen.getByText(/6 packs on 2 lines still to follow/)).toBeTruthy();
  });

  it('starts a week ahead with the order’s own window, and never offers a past day', () => {
    stubFetch({});
    renderWithProviders(<FollowUpPanel order={confirmedWithBackOrder()} />);
    expect(dateInput().value).toBe('2027-03-17');
    expect(dateInput().min).toBe('2027-03-10');
    expect((screen.getByLabelText('Window from') as HTMLInputElement).value).toBe('07:30');
    expect((screen.getByLabelText('Window to') as HTMLInputElement).value).toBe('12:00');
  });

  it('sends the day, window and note, then caches the new order, refreshes this one and the book, and opens the new order', async () => {
    const fetchMock = stubFetch({ ...CSRF, 'POST /api/orders/1/follow-up': { status: 201, body: followUp() } });
    const { router, queryClient } = renderWithProviders(<FollowUpPanel order={confirmedWithBackOrder()} />, {
      routes: [{ path: '/desk/orders/:orderId', element: <p>the new order</p> }],
    });
    const invalidate = vi.spyOn(queryClient, 'invalidateQueries');
    fireEvent.change(dateInput(), { target: { value: '2027-03-24' } });
    fireEvent.change(screen.getByLabelText('Window from'), { target: { value: '12:00' } });
    fireEvent.change(screen.getByLabelText('Window to'), { target: { value: '16:00' } });
    fireEvent.change(screen.getByLabelText('Note to the contractor (optional)'), { target: { value: '  Tiles due in from the works on the 22nd.  ' } });
    submit();
    await waitFor(() => expect(router.state.location.pathname).toBe('/desk/orders/7'));
    expect(sentBody(fetchMock)).toEqual({ requested_date: '2027-03-24', time_window: '12:00-16:00', note: 'Tiles due in from the works on the 22nd.' });
    expect(queryClient.getQueryData(deskKeys.orderDetail(7))).toMatchObject({ reference: 'RL-000007' });
    expect(invalidate).toHaveBeenCalledWith({ queryKey: deskKeys.orderDetail(1) });
    expect(invalidate).toHaveBeenCalledWith({ queryKey: [...deskKeys.orders(), 'list'] });
    expect(await screen.findByText(/RL-000001's back-ordered packs follow as RL-000007/)).toBeTruthy();
  });

  it('leaves a blank window and note out of the body', async () => {
    const fetchMock = stubFetch({ ...CSRF, 'POST /api/orders/1/follow-up': { status: 201, body: followUp() } });
    renderWithProviders(<FollowUpPanel order={confirmedWithBackOrder()} />);
    fireEvent.change(screen.getByLabelText('Window from'), { target: { value: '' } });
    fireEvent.change(screen.getByLabelText('Window to'), { target: { value: '' } });
    submit();
    await waitFor(() => expect(sentBody(fetchMock)).toEqual({ requested_date: '2027-03-17' }));
  });

  it('refuses a day already past and a window with one end, naming the fields, and sends nothing', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<FollowUpPanel order={confirmedWithBackOrder()} />);
    fireEvent.change(dateInput(), { target: { value: '2027-03-09' } });
    fireEvent.change(screen.getByLabelText('Window to'), { target: { value: '' } });
    submit();
    expect(await screen.findByText('is already past: choose 10 Mar 2027 or later')).toBeTruthy();
    expect(screen.getByText('give the start and the end of the window, or neither')).toBeTruthy();
    expect(dateInput().getAttribute('aria-invalid')).toBe('true');
    expect(sentBody(fetchMock)).toBeUndefined();
  });

  it('shows a 422 on the requested day at the date field', async () => {
    stubFetch({
      ...CSRF,
      'POST /api/orders/1/follow-up': {
        status: 422,
        body: { error: { code: 'validation_failed', message: 'Check the fields', details: [{ path: 'requested_date', message: 'must be today or later' }] } },
      },
    });
    renderWithProviders(<FollowUpPanel order={confirmedWithBackOrder()} />);
    submit();
    expect(await screen.findByText('must be today or later')).toBeTruthy();
    expect(dateInput().getAttribute('aria-invalid')).toBe('true');
    expect(dateInput().getAttribute('aria-describedby')).toContain('requested_date-error');
  });

  it('shows a 409 follow_up_exists naming the order that already carries the packs, with a link to it', async () => {
    stubFetch({
      ...CSRF,
      'POST /api/orders/1/follow-up': {
        status: 409,
        body: {
          error: {
            code: 'follow_up_exists',
            message: 'The back-ordered packs of RL-000001 already follow as RL-000005',
            details: [{ message: 'already follows as RL-000005', order_id: 5, reference: 'RL-000005' }],
          },
        },
      },
    });
    const { router } = renderWithProviders(<FollowUpPanel order={confirmedWithBackOrder()} />, { path: '/desk/orders/1' });
    submit();
    expect(await screen.findByText('These packs already follow as RL-000005')).toBeTruthy();
    expect(screen.getByText('The back-ordered packs of RL-000001 already follow as RL-000005.')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Open RL-000005' }).getAttribute('href')).toBe('/desk/orders/5');
    expect(router.state.location.pathname).toBe('/desk/orders/1');
  });

  it('shows a 409 nothing_back_ordered in words above the form', async () => {
    stubFetch({ ...CSRF, 'POST /api/orders/1/follow-up': { status: 409, body: { error: { code: 'nothing_back_ordered', message: 'RL-000001 has no back-ordered packs to send' } } } });
    renderWithProviders(<FollowUpPanel order={confirmedWithBackOrder()} />);
    submit();
    expect(await screen.findByText('Nothing is back-ordered on this order any more')).toBeTruthy();
    expect(screen.getByText(/RL-000001 has no back-ordered packs to send\. Reload the page/)).toBeTruthy();
  });
});

describe('DeskOrderDetail and follow-ups', () => {
  const stock = { 'GET /api/branches/3/stock': { status: 200, body: { branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck' }, items: [stockFixture(11, 'TRS-FL420-SG', 0)] } } };

  it('offers the follow-up only when the server lists start_follow_up', async () => {
    stubFetch(stock);
    const { unmount } = renderWithProviders(<DeskOrderDetail order={confirmedWithBackOrder({ status: 'delivered', status_label: 'Delivered' })} />);
    expect(await screen.findByRole('heading', { name: 'Back-ordered packs' })).toBeTruthy();
    unmount();
    renderWithProviders(<DeskOrderDetail order={confirmedWithBackOrder({ status: 'delivered', status_label: 'Delivered', allowed_actions: [] })} />);
    expect(screen.queryByRole('heading', { name: 'Back-ordered packs' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Start the follow-up order' })).toBeNull();
  });

  it('links, at the top, to the follow-up carrying the packs and to the order they came from', () => {
    stubFetch(stock);
    renderWithProviders(
      <DeskOrderDetail
        order={confirmedWithBackOrder({
          status: 'delivered',
          status_label: 'Delivered',
          allowed_actions: [],
          follows: { id: 2, reference: 'RL-000002', status: 'delivered', status_label: 'Delivered' },
          followed_by: { id: 7, reference: 'RL-000007', status: 'agreed', status_label: 'Changes agreed, waiting for confirmation' },
        })}
      />,
    );
    const links = screen.getByRole('list', { name: 'Linked orders' });
    expect(links.textContent).toContain('The back-ordered packs follow as RL-000007 (Changes agreed, waiting for confirmation)');
    expect(links.textContent).toContain('Carries the back-ordered packs of RL-000002 (Delivered)');
    expect(within(links).getByRole('link', { name: 'RL-000007' }).getAttribute('href')).toBe('/desk/orders/7');
    expect(within(links).getByRole('link', { name: 'RL-000002' }).getAttribute('href')).toBe('/desk/orders/2');
  });

  it('shows no linked orders when the order neither follows nor is followed', () => {
    stubFetch(stock);
    renderWithProviders(<DeskOrderDetail order={confirmedWithBackOrder({ status: 'delivered', allowed_actions: [] })} />);
    expect(screen.queryByRole('list', { name: 'Linked orders' })).toBeNull();
  });
});
