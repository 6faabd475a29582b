import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { quoteRequestListScreen, quoteRequestRowFixture, stubQuoteRequestListApi } from '../../../test-utils/quote-request-fixture';
import { renderWithProviders } from '../../../test-utils/render-with-providers';
import { quoteFiltersFromSearch } from '../lib/list-filters';
import { QuoteRequestsList } from './quote-requests-list';

const row = quoteRequestRowFixture;
// Deliberately in no order a browser sort would give: the screen must keep the server's order.
const serverPage = [row(12, { status: 'accepted' }), row(4), row(31, { status: 'withdrawn' })];

const { sent, header, addressOf, requestLinks, headers, sortButtons } = quoteRequestListScreen;

describe('quoteFiltersFromSearch', () => {
  it("reads the firm's filters from the address and never the merchant's waiting filter", () => {
    expect(quoteFiltersFromSearch(new URLSearchParams('status=accepted&waiting=true&q=Hollin&sort=requested_date&dir=asc&page=2'))).toEqual({
      status: 'accepted',
      q: 'Hollin',
      sort: 'requested_date',
      dir: 'asc',
      page: 2,
      page_size: 25,
    });
  });

  it('drops only the value the server would refuse, keeping the other filters', () => {
    expect(quoteFiltersFromSearch(new URLSearchParams('status=open&dir=sideways&page=-1'))).toMatchObject({ status: 'open', sort: 'created_at', dir: 'desc', page: 1 });
  });
});

describe('QuoteRequestsList', () => {
  it('first asks for page 1 of the newest requests and shows the count, the rows in the server order and a link to each', async () => {
    const queries = stubQuoteRequestListApi(serverPage, 3);
    renderWithProviders(<QuoteRequestsList />, { path: '/quotes' });
    await screen.findByRole('table', { name: 'Quote requests' });
    expect(sent(queries[0])).toEqual({ page: '1', sort: 'created_at', dir: 'desc', page_size: '25' });
    expect(screen.getByText(/^3 requests/).textContent).toBe('3 requests · newest asked first');
    expect(header('Asked').getAttribute('aria-sort')).toBe('descending');
    expect(requestLinks()).toEqual(['Request 12', 'Request 4', 'Request 31']);
    expect(screen.getByRole('link', { name: 'Request 31' }).getAttribute('href')).toBe('/quotes/31');
    // This side's columns, laid out on the one quote-request list.
    expect(headers()).toEqual(['Request', 'Site', 'Wanted', 'Stage', 'Answers', 'Asked']);
    // One page only: nothing to turn.
    expect(screen.queryByRole('navigation', { name: 'Pages of the quote requests' })).toBeNull();
  });

  it('sorts by the pressed header from page 1 and keeps the sort in the address', async () => {
    const queries = stubQuoteRequestListApi(serverPage, 120);
    const { router } = renderWithProviders(<QuoteRequestsList />, { path: '/quotes?page=2' });
    await screen.findByRole('table', { name: 'Quote requests' });
    expect(sortButtons()).toEqual(['Wanted', 'Asked']);

    // The list starts newest asked first, so pressing Asked asks for the oldest first.
    fireEvent.click(within(header('Asked')).getByRole('button'));
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ page: '1', sort: 'created_at', dir: 'asc' }));
    expect(addressOf(router)).toEqual({ sort: 'created_at', dir: 'asc' });
    expect(header('Asked').getAttribute('aria-sort')).toBe('ascending');

    fireEvent.click(within(header('Wanted')).getByRole('button'));
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ page: '1', sort: 'requested_date', dir: 'asc' }));
    expect(header('Asked').getAttribute('aria-sort')).toBe('none');
  });

  it('sends the chosen stage and the search words from page 1, never the waiting filter', async () => {
    const queries = stubQuoteRequestListApi(serverPage, 120);
    const { router } = renderWithProviders(<QuoteRequestsList />, { path: '/quotes?page=3&waiting=true' });
    await screen.findByRole('table', { name: 'Quote requests' });
    expect(screen.queryByRole('checkbox')).toBeNull();

    fireEvent.change(await screen.findByRole('combobox', { name: 'Stage' }), { target: { value: 'withdrawn' } });
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ status: 'withdrawn', page: '1' }));

    fireEvent.change(screen.getByRole('searchbox', { name: 'Search quote requests' }), { target: { value: 'HB-1' } });
    fireEvent.click(screen.getByRole('button', { name: 'Search' }));
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ status: 'withdrawn', q: 'HB-1', page: '1' }));
    expect(addressOf(router)).toMatchObject({ status: 'withdrawn', q: 'HB-1' });
    for (const q of queries) expect(q.has('waiting')).toBe(false);
  });

  it('turns to the next page and back', async () => {
    const queries = stubQuoteRequestListApi(serverPage, 30);
    const { router } = renderWithProviders(<QuoteRequestsList />, { path: '/quotes' });
    await screen.findByText('Page 1 of 2');
    expect(screen.getByText(/^30 requests/)).toBeTruthy();

    fireEvent.click(screen.getByRole('button', { name: 'Next page' }));
    await waitFor(() => expect(sent(queries.at(-1))).toMatchObject({ page: '2', sort: 'created_at', dir: 'desc' }));
    await screen.findByText('Page 2 of 2');
    expect((screen.getByRole('button', { name: 'Next page' }) as HTMLButtonElement).disabled).toBe(true);
    expect(addressOf(router)).toEqual({ page: '2' });

    await router.navigate(-1);
    await screen.findByText('Page 1 of 2');
  });

  it('says which filters are on when nothing matches', async () => {
    stubQuoteRequestListApi([], 0);
    renderWithProviders(<QuoteRequestsList />, { path: '/quotes?status=accepted&q=Kelder' });
    await screen.findByText('No quote request matches');
    expect(screen.getByText(/^Showing/).textContent).toBe('Showing stage Accepted, search “Kelder”.');
  });
});
