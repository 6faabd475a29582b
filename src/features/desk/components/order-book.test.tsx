import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { orderSummaryFixture, stubOrderListApi } from '../../../test-utils/order-book-fixture';
import { renderWithProviders } from '../../../test-utils/render-with-providers';
import { OrderBook, filtersFromSearch } from './order-book';

const order = orderSummaryFixture;

// Deliberately not in any order a browser sort would give: the screen must keep the server's order.
const serverPage = [order(12, { subtotal: 9_000 }), order(4, { subtotal: 120_000 }), order(31, { subtotal: 45_000 })];

const stubOrderApi = () => stubOrderListApi(serverPage, 25, { '/api/organisation': { id: 2, name: 'Tollerbeck Roofing Supplies', kind: 'merchant', branches: [] } });

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
    expect(
      within(table)
        .getAllByRole('button')
        .map((b) => b.textContent),
    ).toEqual(['Wanted', 'Stage', 'Subtotal', 'Placed', 'Last change']);
    for (const name of ['Order', 'Contractor', 'Site', 'Branch', 'Lines']) expect(header(name).getAttribute('aria-sort')).toBeNull();
  });

  it("lets a phone pick the sort from a list, since most headers sit off the screen's edge", async () => {
    const queries = stubOrderApi();
    renderWithProviders(<OrderBook />, { path: '/desk/orders?page=2' });
    await screen.findByRole('table', { name: 'Order book' });
    fireEvent.change(await screen.findByLabelText('Sort'), { target: { value: 'subtotal:asc' } });
    await waitFor(() => expect(sortOf(queries.at(-1)!)).toEqual({ sort: 'subtotal', dir: 'asc', page: '1' }));
    expect(header('Subtotal').getAttribute('aria-sort')).toBe('ascending');
  });
});

describe('OrderBook search bar', () => {
  const branches = [
    { id: 3, name: 'Tollerbeck Yard', address: '1 Quay Road', town: 'Tollerbeck', phone: null },
    { id: 7, name: 'Caddonmere Wharf', address: 'Wharf Lane', town: 'Caddonmere', phone: null },
  ];
  const stubWithBranches = () => stubOrderListApi(serverPage, 25, { '/api/organisation': { id: 2, name: 'Tollerbeck Roofing Supplies', kind: 'merchant', branches } });
  const addressOf = (router: { state: { location: { search: string } } }) => Object.fromEntries(new URLSearchParams(router.state.location.search));

  it('asks at once for a chosen stage from page 1, and shows the branch the address holds once the branches have loaded', async () => {
    const queries = stubWithBranches();
    const { router } = renderWithProviders(<OrderBook />, { path: '/desk/orders?branch_id=7&page=2' });
    await screen.findByRole('table', { name: 'Order book' });
    await waitFor(() => expect((screen.getByLabelText('Branch') as HTMLSelectElement).value).toBe('7'));

    fireEvent.change(await screen.findByLabelText('Stage'), { target: { value: 'sent,agreed' } });
    await waitFor(() => expect(queries.at(-1)!.get('statuses')).toBe('sent,agreed'));
    expect(queries.at(-1)!.get('branch_id')).toBe('7');
    expect(addressOf(router)).toEqual({ statuses: 'sent,agreed', branch_id: '7' });
  });

  it('sends the words and the dates on Search, keeping the defaults out of the address', async () => {
    const queries = stubWithBranches();
    const { router } = renderWithProviders(<OrderBook />, { path: '/desk/orders' });
    await screen.findByRole('table', { name: 'Order book' });
    fireEvent.change(screen.getByLabelText('Search orders'), { target: { value: '  HB-P05 ' } });
    fireEvent.change(screen.getByLabelText('From'), { target: { value: '2027-03-01' } });
    fireEvent.change(screen.getByLabelText('To'), { target: { value: '2027-03-31' } });
    fireEvent.click(screen.getByRole('button', { name: 'Search' }));
    await waitFor(() => expect(addressOf(router)).toEqual({ q: 'HB-P05', date_from: '2027-03-01', date_to: '2027-03-31' }));
    await waitFor(() => expect(queries.at(-1)!.get('q')).toBe('HB-P05'));
  });

  it('refuses a To day before the From day on the To box, linked by aria-describedby, and asks nothing new', async () => {
    const queries = stubWithBranches();
    const { router } = renderWithProviders(<OrderBook />, { path: '/desk/orders' });
    await screen.findByRole('table', { name: 'Order book' });
    const asks = queries.length;
    fireEvent.change(screen.getByLabelText('From'), { target: { value: '2027-03-31' } });
    const to = screen.getByLabelText('To');
    fireEvent.change(to, { target: { value: '2027-03-01' } });
    fireEvent.click(screen.getByRole('button', { name: 'Search' }));
    await waitFor(() => expect(to.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(to.getAttribute('aria-describedby')!)?.textContent).toContain('on or after the From day');
    expect(queries.length).toBe(asks);
    expect(addressOf(router)).toEqual({});
  });
});
