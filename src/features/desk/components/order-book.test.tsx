import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import type { OrderSummary } from '../../../../shared/schemas/order.schema';
import { renderWithProviders } from '../../../test-utils/render-with-providers';
import { OrderBook, filtersFromSearch } from './order-book';

/** Invented orders of an invented merchant; only the fields the order book shows matter here. */
function order(id: number, overrides: Partial<OrderSummary> = {}): OrderSummary {
  return {
    id,
    reference: `RL-${String(id).padStart(6, '0')}`,
    status: 'sent',
    status_label: 'Sent',
    revision: 1,
    contractor: { id: 5, name: 'Brackenfold Roofworks' },
    branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck', merchant: { id: 2, name: 'Tollerbeck Roofing Supplies' } },
    project: { id: 8, name: 'Hollin Brow' },
    requested_date: '2027-03-10',
    time_window: null,
    delivery_method: 'ground',
    po_reference: '',
    subtotal: 61_440,
    line_count: 3,
    placed_at: '2027-03-01 09:00:00',
    updated_at: '2027-03-01 09:00:00',
    ...overrides,
  };
}

// Deliberately not in any order a browser sort would give: the screen must keep the server's order.
const serverPage = [order(12, { subtotal: 9_000 }), order(4, { subtotal: 120_000 }), order(31, { subtotal: 45_000 })];

/** Answers the order book's two calls and records every query string sent to /api/orders. */
function stubOrderApi() {
  const orderQueries: URLSearchParams[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL) => {
    const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost');
    const json = (body: unknown) => new Response(JSON.stringify(body), { status: 200, headers: { 'Content-Type': 'application/json' } });
    if (url.pathname === '/api/organisation') return json({ id: 2, name: 'Tollerbeck Roofing Supplies', kind: 'merchant', branches: [] });
    if (url.pathname === '/api/orders') {
      orderQueries.push(url.searchParams);
      return json({ orders: serverPage, total: 120, total_capped: false, page: Number(url.searchParams.get('page')), page_size: 25 });
    }
    return new Response(JSON.stringify({ error: { code: 'not_found', message: `No mocked answer for ${url.pathname}` } }), { status: 404 });
  });
  vi.stubGlobal('fetch', fetchMock);
  return orderQueries;
}

const sortOf = (q: URLSearchParams) => ({ sort: q.get('sort'), dir: q.get('dir'), page: q.get('page') });
const header = (name: string) => screen.getByRole('columnheader', { name: new RegExp(`^${name}`) });
const references = () =>
  within(screen.getByRole('table', { name: 'Order book' }))
    .getAllByRole('row')
    .slice(1)
    .map((row) => within(row).getAllByRole('cell')[0].textContent);

describe('filtersFromSearch', () => {
  it('reads the order book filters from the address, as the server will read them', () => {
    const filters = filtersFromSearch(new URLSearchParams('statuses=sent,agreed&branch_id=3&sort=requested_date&dir=asc&page=2&page_size=50&date_from=2027-03-01&date_to=2027-03-31'));
    expect(filters).toEqual({
      statuses: 'sent,agreed',
      branch_id: 3,
      q: undefined,
      sort: 'requested_date',
      dir: 'asc',
      page: 2,
      page_size: 50,
      date_from: '2027-03-01',
      date_to: '2027-03-31',
      date_field: 'requested_date',
    });
  });

  it('falls back to the first page of newest orders when the address holds something the server would refuse', () => {
    const filters = filtersFromSearch(new URLSearchParams('statuses=lost&page=0'));
    expect(filters).toMatchObject({ statuses: undefined, sort: 'placed_at', dir: 'desc', page: 1, page_size: 25 });
  });
});

describe('OrderBook sorting', () => {
  it('asks the server for the pressed column from page 1, and shows the rows in the order the server sent', async () => {
    const queries = stubOrderApi();
    const { router } = renderWithProviders(<OrderBook />, { path: '/desk/orders?sort=requested_date&dir=asc&page=3' });
    await screen.findByRole('table', { name: 'Order book' });
    expect(sortOf(queries.at(-1)!)).toEqual({ sort: 'requested_date', dir: 'asc', page: '3' });
    expect(header('Wanted').getAttribute('aria-sort')).toBe('ascending');

    fireEvent.click(within(header('Subtotal')).getByRole('button'));

    // A money column starts with the largest; page 3 of the old order means nothing in the new one.
    await waitFor(() => expect(sortOf(queries.at(-1)!)).toEqual({ sort: 'subtotal', dir: 'desc', page: '1' }));
    const search = new URLSearchParams(router.state.location.search);
    expect([search.get('sort'), search.get('dir'), search.get('page')]).toEqual(['subtotal', 'desc', null]);
    expect(header('Subtotal').getAttribute('aria-sort')).toBe('descending');
    expect(header('Wanted').getAttribute('aria-sort')).toBe('none');
    await waitFor(() => expect(screen.getByText(/largest subtotal first/)).toBeTruthy());
    expect(references()).toEqual(['RL-000012', 'RL-000004', 'RL-000031']);
  });

  it('asks for the other direction when the sorted header is pressed again', async () => {
    const queries = stubOrderApi();
    renderWithProviders(<OrderBook />, { path: '/desk/orders' });
    await screen.findByRole('table', { name: 'Order book' });
    // The server's default is the newest placed first, and the header says so.
    expect(header('Placed').getAttribute('aria-sort')).toBe('descending');

    fireEvent.click(within(header('Placed')).getByRole('button'));
    await waitFor(() => expect(sortOf(queries.at(-1)!)).toEqual({ sort: 'placed_at', dir: 'asc', page: '1' }));
    expect(header('Placed').getAttribute('aria-sort')).toBe('ascending');
  });

  it('keeps the sort in the address, so Back returns to the previous order', async () => {
    stubOrderApi();
    const { router } = renderWithProviders(<OrderBook />, { path: '/desk/orders?sort=requested_date&dir=asc' });
    await screen.findByRole('table', { name: 'Order book' });
    fireEvent.click(within(header('Stage')).getByRole('button'));
    await waitFor(() => expect(header('Stage').getAttribute('aria-sort')).toBe('ascending'));

    await router.navigate(-1);
    await waitFor(() => expect(header('Wanted').getAttribute('aria-sort')).toBe('ascending'));
    expect(header('Stage').getAttribute('aria-sort')).toBe('none');
    expect(router.state.location.search).toBe('?sort=requested_date&dir=asc');
  });

  it('offers header buttons only on the columns the server can sort by', async () => {
    stubOrderApi();
    renderWithProviders(<OrderBook />, { path: '/desk/orders' });
    const table = await screen.findByRole('table', { name: 'Order book' });
    expect(within(table).getAllByRole('button').map((b) => b.textContent)).toEqual(['Wanted', 'Stage', 'Subtotal', 'Placed', 'Last change']);
    for (const name of ['Order', 'Contractor', 'Site', 'Branch', 'Lines']) expect(header(name).getAttribute('aria-sort')).toBeNull();
  });

  it("lets a phone pick the sort from a list, since most headers sit off the screen's edge", async () => {
    const queries = stubOrderApi();
    renderWithProviders(<OrderBook />, { path: '/desk/orders?page=2' });
    await screen.findByRole('table', { name: 'Order book' });
    fireEvent.change(screen.getByLabelText('Sort'), { target: { value: 'subtotal:asc' } });
    await waitFor(() => expect(sortOf(queries.at(-1)!)).toEqual({ sort: 'subtotal', dir: 'asc', page: '1' }));
    expect(header('Subtotal').getAttribute('aria-sort')).toBe('ascending');
  });
});

