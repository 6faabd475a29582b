import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { quoteRequestListScreen, quoteRequestRowFixture, stubQuoteRequestListApi } from '../../../test-utils/quote-request-fixture';
import { renderWithProviders } from '../../../test-utils/render-with-providers';
import { deskFiltersFromSearch } from '../lib/list-filters';
import { DeskQuoteRequests } from './desk-quote-requests';

const row = quoteRequestRowFixture;
// Deliberately in no order a browser sort would give: the screen must keep the server's order.
const serverPage = [row(12, { requested_date: '2027-04-02' }), row(4, { requested_date: '2027-03-01' }), row(31, { requested_date: '2027-05-20' })];

const { sent, header, addressOf, requestLinks, headers, sortButtons } = quoteRequestListScreen;

describe('deskFiltersFromSearch', () => {
  it('reads the filters from the address as the server will read them', () => {
    expect(deskFiltersFromSearch(new URLSearchParams('status=open&waiting=true&q=Q-12&sort=requested_date&dir=asc&page=3&page_size=50'))).toEqual({
      status: 'open',
      waiting: true,
      q: 'Q-12',
      sort: 'requested_date',
      dir: 'asc',
      page: 3,
      page_size: 50,
    });
  });

  it('drops only the value the server would refuse, keeping the other filters', () => {
    expect(deskFiltersFromSearch(new URLSearchParams('status=lost&waiting=maybe&sort=price&page=0&page_size=500&q=Hollin&extra=1'))).toEqual({
      status: undefined,
      waiting: undefined,
      q: 'Hollin',
      sort: 'created_at',
      dir: 'desc',
      page: 1,
      page_size: 25,
    });
  });
});

describe('DeskQuoteRequests', () => {
  it('first asks for page 1 of the newest requests and shows the count, the rows in the server order and a link to each', async () => {
    const queries = stubQuoteRequestListApi(serverPage, 42);
    renderWithProviders(<DeskQuoteRequests />, { path: '/desk/quotes' });
    await screen.findByRole('table', { name: 'Quote requests' });
    expect(sent(queries[0])).toEqual({ page: '1', sort: 'created_at', dir: 'desc', page_size: '25' });
    expect(screen.getByText(/^42 requests/).textContent).toBe('42 requests · newest asked first');
    expect(header('Asked').getAttribute('aria-sort')).toBe('descending');
    expect(header('Wanted').getAttribute('aria-sort')).toBe('none');
    expect(requestLinks()).toEqual(['Request 12', 'Request 4', 'Request 31']);
    expect(screen.getByRole('link', { name: 'Request 12' }).getAttribute('href')).toBe('/desk/quotes/12');
    // This side's columns, laid out on the one quote-request list.
    expect(headers()).toEqual(['Request', 'Contractor', 'Site', 'Wanted', 'Your answer', 'Asked']);
    expect(screen.getByText('Page 1 of 2')).toBeTruthy();
  });

  it('sorts by the pressed header from page 1, puts the sort in the address, and flips it on a second press', async () => {
    const queries = stubQuoteRequestListApi(serverPage, 120);
    const { router } = renderWithProviders(<DeskQuoteRequests />, { path: '/desk/quotes?page=3' });
    await screen.findByRole('table', { name: 'Quote requests' });
    expect(sent(queries.at(-1))).toMatchObject({ page: '3', sort: 'created_at', dir: 'desc' });
    // Only the columns the server can sort by have a header button.
    expect(sortButtons()).toEqual(['Wanted', 'Asked']);

    fireEvent.click(within(header('Wanted')).getByRole('button'));
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ page: '1', sort: 'requested_date', dir: 'asc' }));
    expect(addressOf(router)).toEqual({ sort: 'requested_date', dir: 'asc' });
    expect(header('Wanted').getAttribute('aria-sort')).toBe('ascending');
    expect(header('Asked').getAttribute('aria-sort')).toBe('none');
    await waitFor(() => expect(screen.getByText(/soonest wanted first/)).toBeTruthy());
    expect(requestLinks()).toEqual(['Request 12', 'Request 4', 'Request 31']);

    fireEvent.click(within(header('Wanted')).getByRole('button'));
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ page: '1', sort: 'requested_date', dir: 'desc' }));

    // Back returns to the sort before.
    await router.navigate(-1);
    await waitFor(() => expect(header('Wanted').getAttribute('aria-sort')).toBe('ascending'));
  });

  it('asks only for the requests waiting for our price when the box is ticked, from page 1', async () => {
    const queries = stubQuoteRequestListApi(serverPage, 120);
    const { router } = renderWithProviders(<DeskQuoteRequests />, { path: '/desk/quotes?page=2' });
    await screen.findByRole('table', { name: 'Quote requests' });
    expect(queries.at(-1)?.has('waiting')).toBe(false);

    fireEvent.click(await screen.findByRole('checkbox', { name: 'Only those waiting for our price' }));
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ waiting: 'true', page: '1' }));
    expect(addressOf(router)).toEqual({ waiting: 'true' });

    fireEvent.click(await screen.findByRole('checkbox', { name: 'Only those waiting for our price' }));
    await waitFor(() => expect(queries.at(-1)?.has('waiting')).toBe(false));
    expect(addressOf(router)).toEqual({});
  });

  it('sends the chosen stage and the search words, each from page 1', async () => {
    const queries = stubQuoteRequestListApi(serverPage, 120);
    const { router } = renderWithProviders(<DeskQuoteRequests />, { path: '/desk/quotes?page=4' });
    await screen.findByRole('table', { name: 'Quote requests' });

    fireEvent.change(await screen.findByRole('combobox', { name: 'Stage' }), { target: { value: 'open' } });
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ status: 'open', page: '1' }));

    fireEvent.change(screen.getByRole('searchbox', { name: 'Search quote requests' }), { target: { value: '  Q-12 ' } });
    // Enter in the box submits the search form.
    fireEvent.submit(screen.getByRole('search'));
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ status: 'open', q: 'Q-12', page: '1' }));
    expect(addressOf(router)).toEqual({ status: 'open', q: 'Q-12' });
  });

  it('turns the pages with the address, and shows where it is', async () => {
    const queries = stubQuoteRequestListApi(serverPage, 120);
    const { router } = renderWithProviders(<DeskQuoteRequests />, { path: '/desk/quotes?sort=requested_date&dir=asc' });
    await screen.findByText('Page 1 of 5');
    expect((screen.getByRole('button', { name: 'Previous page' }) as HTMLButtonElement).disabled).toBe(true);

    fireEvent.click(screen.getByRole('button', { name: 'Next page' }));
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ page: '2', sort: 'requested_date', dir: 'asc' }));
    await screen.findByText('Page 2 of 5');
    expect(addressOf(router)).toEqual({ sort: 'requested_date', dir: 'asc', page: '2' });

    fireEvent.click(screen.getByRole('button', { name: 'Previous page' }));
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ page: '1' }));
  });

  it('says which filters are on when nothing matches, and clears them but keeps the sort', async () => {
    stubQuoteRequestListApi([], 0);
    const { router } = renderWithProviders(<DeskQuoteRequests />, { path: '/desk/quotes?status=withdrawn&waiting=true&q=Q-99&sort=requested_date&dir=asc' });
    await screen.findByText('No quote request matches');
    expect(screen.getByText(/^Showing/).textContent).toBe('Showing stage Withdrawn, only those waiting for our price, search “Q-99”.');
    expect(screen.getByText(/^0 requests/)).toBeTruthy();

    fireEvent.click(screen.getAllByRole('button', { name: 'Clear the filters' })[0]);
    await waitFor(() => expect(addressOf(router)).toEqual({ sort: 'requested_date', dir: 'asc' }));
    await screen.findByText('No quote requests yet');
  });
});
