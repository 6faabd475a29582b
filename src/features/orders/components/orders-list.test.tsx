import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { orderSummaryFixture, stubOrderListApi } from '../../../test-utils/order-book-fixture';
import { renderWithProviders } from '../../../test-utils/render-with-providers';
import { OrdersList, listStateFromSearch } from './orders-list';

const order = orderSummaryFixture;

// In no order a browser sort of any column would give: the screen must keep the server's order.
const serverPage = [
  order(12, { subtotal: 9_000, requested_date: '2027-03-20', placed_at: '2027-03-02 09:00:00', status: 'delivered' }),
  order(4, { subtotal: 120_000, requested_date: '2027-03-05', placed_at: '2027-03-09 09:00:00', status: 'confirmed' }),
  order(31, { subtotal: 45_000, requested_date: '2027-03-28', placed_at: '2027-03-01 09:00:00', status: 'sent' }),
];

const stubOrderApi = () => stubOrderListApi(serverPage, 50);

const asked = (q: URLSearchParams | undefined) => ({ sort: q?.get('sort'), dir: q?.get('dir'), page: q?.get('page'), status: q?.get('status') ?? null, q: q?.get('q') ?? null });
const header = (name: string) => screen.getByRole('columnheader', { name: new RegExp(`^${name}`) });
const pressHeader = (name: string) => fireEvent.click(within(header(name)).getByRole('button'));
const references = () =>
  within(screen.getByRole('table', { name: 'Orders' }))
    .getAllByRole('row')
    .slice(1)
    .map((row) => within(row).getAllByRole('cell')[0].textContent);
// The first render loads the modules and the first answer; a busy two-core machine can need more than a second.
const tableShown = () => screen.findByRole('table', { name: 'Orders' }, { timeout: 5000 });
const addressOf = (router: { state: { location: { search: string } } }) => Object.fromEntries(new URLSearchParams(router.state.location.search));

describe('listStateFromSearch', () => {
  it('reads stage, search, sort, direction and page from the address as the server reads them', () => {
    expect(listStateFromSearch(new URLSearchParams('status=delivered&q=QB-7&sort=subtotal&dir=asc&page=2'))).toEqual({ status: 'delivered', q: 'QB-7', sort: 'subtotal', dir: 'asc', page: 2 });
  });

  it('drops only the values the server would refuse, keeping the rest of the address', () => {
    expect(listStateFromSearch(new URLSearchParams('status=lost&sort=requested_date&dir=sideways&page=0&q=Hollin'))).toEqual({ status: undefined, q: 'Hollin', sort: 'requested_date', dir: 'desc', page: 1 });
  });

  it('falls back to the newest placed first for a sort the table has no column for', () => {
    expect(listStateFromSearch(new URLSearchParams('sort=updated_at&dir=asc'))).toMatchObject({ sort: 'placed_at', dir: 'asc' });
  });
});

describe('OrdersList sorting and paging through the server', () => {
  it('asks the server for the pressed column from page 1, puts it in the address, and keeps the rows in the order sent', async () => {
    const queries = stubOrderApi();
    const { router } = renderWithProviders(<OrdersList />, { path: '/orders?sort=requested_date&dir=asc&page=3' });
    await tableShown();
    expect(asked(queries.at(-1))).toMatchObject({ sort: 'requested_date', dir: 'asc', page: '3' });
    expect(queries.at(-1)?.get('page_size')).toBe('50');
    expect(header('Wanted').getAttribute('aria-sort')).toBe('ascending');

    pressHeader('Subtotal');

    // A money column starts with the largest; page 3 of the old order means nothing in the new one.
    await waitFor(() => expect(asked(queries.at(-1))).toMatchObject({ sort: 'subtotal', dir: 'desc', page: '1' }));
    expect(addressOf(router)).toEqual({ sort: 'subtotal', dir: 'desc' });
    expect(header('Subtotal').getAttribute('aria-sort')).toBe('descending');
    expect(header('Wanted').getAttribute('aria-sort')).toBe('none');
    await waitFor(() => expect(screen.getByText(/largest subtotal first/)).toBeTruthy());
    expect(references()).toEqual(['RL-000012', 'RL-000004', 'RL-000031']);
  });

  it('starts with the newest placed first and flips the direction when that header is pressed again', async () => {
    const queries = stubOrderApi();
    renderWithProviders(<OrdersList />, { path: '/orders' });
    await tableShown();
    expect(asked(queries.at(-1))).toMatchObject({ sort: 'placed_at', dir: 'desc', page: '1' });
    expect(header('Placed').getAttribute('aria-sort')).toBe('descending');

    pressHeader('Placed');
    await waitFor(() => expect(asked(queries.at(-1))).toMatchObject({ sort: 'placed_at', dir: 'asc', page: '1' }));
    expect(header('Placed').getAttribute('aria-sort')).toBe('ascending');
    expect(references()).toEqual(['RL-000012', 'RL-000004', 'RL-000031']);
  });

  it('returns to the previous sort on Back, and to the newer one on Forward', async () => {
    const queries = stubOrderApi();
    const { router } = renderWithProviders(<OrdersList />, { path: '/orders?sort=requested_date&dir=asc' });
    await tableShown();
    pressHeader('Stage');
    await waitFor(() => expect(header('Stage').getAttribute('aria-sort')).toBe('ascending'));

    await router.navigate(-1);
    await waitFor(() => expect(header('Wanted').getAttribute('aria-sort')).toBe('ascending'));
    expect(header('Stage').getAttribute('aria-sort')).toBe('none');
    expect(router.state.location.search).toBe('?sort=requested_date&dir=asc');

    await router.navigate(1);
    await waitFor(() => expect(header('Stage').getAttribute('aria-sort')).toBe('ascending'));
    // The header follows the address at once; the cached answer is fetched again a moment later.
    await waitFor(() => expect(asked(queries.at(-1))).toMatchObject({ sort: 'status', dir: 'asc' }));
  });

  it('keeps the sort when the stage or the search changes, and starts that filter at page 1', async () => {
    const queries = stubOrderApi();
    const { router } = renderWithProviders(<OrdersList />, { path: '/orders?sort=subtotal&dir=asc&page=2' });
    await tableShown();

    fireEvent.change(await screen.findByLabelText('Stage'), { target: { value: 'delivered' } });
    await waitFor(() => expect(asked(queries.at(-1))).toEqual({ sort: 'subtotal', dir: 'asc', page: '1', status: 'delivered', q: null }));
    expect(addressOf(router)).toEqual({ sort: 'subtotal', dir: 'asc', status: 'delivered' });

    fireEvent.change(screen.getByLabelText('Search orders'), { target: { value: '  Hollin  ' } });
    fireEvent.click(screen.getByRole('button', { name: 'Search' }));
    await waitFor(() => expect(asked(queries.at(-1))).toEqual({ sort: 'subtotal', dir: 'asc', page: '1', status: 'delivered', q: 'Hollin' }));
    expect(addressOf(router)).toEqual({ sort: 'subtotal', dir: 'asc', status: 'delivered', q: 'Hollin' });
    expect(header('Subtotal').getAttribute('aria-sort')).toBe('ascending');
  });

  it('shows the filters an address holds when the page is opened from it', async () => {
    const queries = stubOrderApi();
    renderWithProviders(<OrdersList />, { path: '/orders?status=confirmed&q=QB-7&sort=requested_date&dir=desc' });
    await tableShown();
    expect(asked(queries.at(-1))).toEqual({ sort: 'requested_date', dir: 'desc', page: '1', status: 'confirmed', q: 'QB-7' });
    expect(((await screen.findByLabelText('Stage')) as HTMLSelectElement).value).toBe('confirmed');
    expect((screen.getByLabelText('Search orders') as HTMLInputElement).value).toBe('QB-7');
  });

  it('turns pages through the address, keeping the sort, so Back returns to the page before', async () => {
    const queries = stubOrderApi();
    const { router } = renderWithProviders(<OrdersList />, { path: '/orders?sort=subtotal&dir=desc' });
    await tableShown();
    expect(screen.getByText('Page 1 of 3')).toBeTruthy();

    fireEvent.click(screen.getByRole('button', { name: 'Next page' }));
    await waitFor(() => expect(asked(queries.at(-1))).toMatchObject({ sort: 'subtotal', dir: 'desc', page: '2' }));
    expect(addressOf(router)).toEqual({ sort: 'subtotal', dir: 'desc', page: '2' });
    await waitFor(() => expect(screen.getByText('Page 2 of 3')).toBeTruthy());

    await router.navigate(-1);
    await waitFor(() => expect(screen.getByText('Page 1 of 3')).toBeTruthy());
    expect(addressOf(router)).toEqual({ sort: 'subtotal', dir: 'desc' });
  });

  it('offers header buttons only on the columns the server can sort by', async () => {
    stubOrderApi();
    renderWithProviders(<OrdersList />, { path: '/orders' });
    const table = await tableShown();
    expect(
      within(table)
        .getAllByRole('button')
        .map((b) => b.textContent),
    ).toEqual(['Wanted', 'Stage', 'Subtotal', 'Placed']);
    for (const name of ['Order', 'Site', 'Merchant', 'Unloading']) expect(header(name).getAttribute('aria-sort')).toBeNull();
  });

  it("lets a phone pick the sort from a list, since most headers sit off the screen's edge", async () => {
    const queries = stubOrderApi();
    const { router } = renderWithProviders(<OrdersList />, { path: '/orders?page=2&status=sent' });
    await tableShown();
    fireEvent.change(await screen.findByLabelText('Sort'), { target: { value: 'requested_date:asc' } });
    await waitFor(() => expect(asked(queries.at(-1))).toEqual({ sort: 'requested_date', dir: 'asc', page: '1', status: 'sent', q: null }));
    expect(addressOf(router)).toEqual({ sort: 'requested_date', dir: 'asc', status: 'sent' });
    expect(header('Wanted').getAttribute('aria-sort')).toBe('ascending');
  });

  it('refuses search words over 100 characters on the box itself, linked by aria-describedby, and asks nothing new', async () => {
    const queries = stubOrderApi();
    const { router } = renderWithProviders(<OrdersList />, { path: '/orders' });
    await tableShown();
    const asks = queries.length;
    const box = screen.getByLabelText('Search orders');
    fireEvent.change(box, { target: { value: 'x'.repeat(101) } });
    fireEvent.click(screen.getByRole('button', { name: 'Search' }));
    await waitFor(() => expect(box.getAttribute('aria-invalid')).toBe('true'));
    const message = document.getElementById(box.getAttribute('aria-describedby')!);
    expect(message?.textContent).toContain('at most 100 characters');
    expect(queries.length).toBe(asks);
    expect(addressOf(router)).toEqual({});
  });

  it('puts the words of each step back in the box when the address moves, on Back too', async () => {
    stubOrderApi();
    const { router } = renderWithProviders(<OrdersList />, { path: '/orders' });
    await tableShown();
    const box = screen.getByLabelText('Search orders') as HTMLInputElement;
    fireEvent.change(box, { target: { value: 'Hollin' } });
    fireEvent.click(screen.getByRole('button', { name: 'Search' }));
    await waitFor(() => expect(addressOf(router)).toEqual({ q: 'Hollin' }));
    await router.navigate('/orders?q=Quarry');
    await waitFor(() => expect(box.value).toBe('Quarry'));
    await router.navigate(-1);
    await waitFor(() => expect(box.value).toBe('Hollin'));
    expect(((await screen.findByLabelText('Stage')) as HTMLSelectElement).value).toBe('');
  });

  it('keeps each row linking to its order and its site', async () => {
    stubOrderApi();
    renderWithProviders(<OrdersList />, { path: '/orders' });
    const table = await tableShown();
    expect(within(table).getByRole('link', { name: 'RL-000004' }).getAttribute('href')).toBe('/orders/4');
    expect(within(table).getAllByRole('link', { name: 'Hollin Brow' })[0].getAttribute('href')).toBe('/sites/8');
  });
});
