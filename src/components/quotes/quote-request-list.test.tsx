import { useQuery } from '@tanstack/react-query';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { QuoteRequestList as QuoteRequestListPage } from '../../../shared/schemas/order.schema';
import { quoteRequestRowFixture } from '../../test-utils/quote-request-fixture';
import { renderWithProviders } from '../../test-utils/render-with-providers';
import { useListAddress } from '../ui/server-list';
import { quoteRequestFiltersFromSearch, quoteRequestListParams } from './list-filters';
import { QuoteRequestList, quoteRequestColumns as c } from './quote-request-list';
import type { QuoteRequestListSide } from './quote-request-list';

const row = quoteRequestRowFixture;
const priced = row(8, {
  status: 'accepted',
  quotes: [
    { id: 201, status: 'accepted', total: 123456, branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck', merchant: { id: 2, name: 'Tollerbeck Roofing Supplies' } } },
    { id: 202, status: 'declined', total: null, branch: { id: 4, name: 'Cindermoor Depot', town: 'Cindermoor', merchant: { id: 2, name: 'Tollerbeck Roofing Supplies' } } },
  ],
});

/** The two ways the product lays the list out: the merchant's desk (who asked, its own answers, the waiting box) and the contractor's firm. */
const desk: QuoteRequestListSide = {
  columns: c.layout([c.request('/desk/quotes'), c.contractor, c.site, c.wanted, c.answers({ id: 'answer', header: 'Your answer', minWidthClass: 'min-w-48', branchName: (q) => q.branch.name }), c.asked]),
  waitingLabel: 'Only those waiting for our price',
  waitingWords: 'only those waiting for our price',
  searchPlaceholder: 'site or contractor',
  minWidthClass: 'min-w-[52rem]',
  emptyText: 'Nothing asked of your branches yet.',
};
const firm: QuoteRequestListSide = {
  columns: c.layout([
    c.request('/quotes'),
    c.site,
    c.wanted,
    c.stage,
    c.answers({ id: 'quotes', header: 'Answers', minWidthClass: 'min-w-56', branchName: (q) => `${q.branch.merchant.name}, ${q.branch.name}` }),
    c.asked,
  ]),
  searchPlaceholder: 'site or PO',
  minWidthClass: 'min-w-[48rem]',
  emptyText: 'Ask a merchant to price an estimate.',
};

/** A page around the list as the features build it: filters from the address, one query per filter set, recorded. */
function Harness({ side, pages, asked }: { side: QuoteRequestListSide; pages: (params: URLSearchParams) => QuoteRequestListPage | Error; asked: URLSearchParams[] }) {
  const filters = quoteRequestFiltersFromSearch(useListAddress().search, { waiting: Boolean(side.waitingLabel) });
  const requests = useQuery({
    queryKey: ['list', filters],
    queryFn: () => {
      const params = quoteRequestListParams(filters);
      asked.push(params);
      const page = pages(params);
      if (page instanceof Error) throw page;
      return page;
    },
  });
  return <QuoteRequestList side={side} filters={filters} requests={requests} />;
}

const onePage = (rows: QuoteRequestListPage['quote_requests']) => () => ({ quote_requests: rows, total: rows.length, page: 1, page_size: 25 });
const headers = () =>
  within(screen.getByRole('table', { name: 'Quote requests' }))
    .getAllByRole('columnheader')
    .map((h) => h.textContent);
const cells = (name: string) =>
  within(screen.getByRole('link', { name }).closest('tr')!)
    .getAllByRole('cell')
    .map((td) => td.textContent);

describe('QuoteRequestList', () => {
  it("lays out the desk's side: who asked, each of its branches' answers by branch name, links into the desk", async () => {
    renderWithProviders(<Harness side={desk} pages={onePage([priced])} asked={[]} />, { path: '/desk/quotes' });
    await screen.findByRole('table', { name: 'Quote requests' });
    expect(headers()).toEqual(['Request', 'Contractor', 'Site', 'Wanted', 'Your answer', 'Asked']);
    expect(cells('Request 8')).toEqual(['Request 8', 'Brackenfold Roofworks', 'Hollin Brow, plots 1–20', '10 Mar 2027', expect.stringContaining('Tollerbeck Yard: '), '1 Mar 2027']);
    // The money goes through the one formatter, in the configured currency (GBP in tests).
    expect(cells('Request 8')[4]).toMatch(/^Tollerbeck Yard: .+ · £1,234\.56Cindermoor Depot: .+$/);
    expect(screen.getByRole('link', { name: 'Request 8' }).getAttribute('href')).toBe('/desk/quotes/8');
    expect(await screen.findByRole('checkbox', { name: 'Only those waiting for our price' })).toBeTruthy();
  });

  it("lays out the firm's side: the request's stage and every merchant's answer named with its firm, no waiting box", async () => {
    renderWithProviders(<Harness side={firm} pages={onePage([priced])} asked={[]} />, { path: '/quotes' });
    await screen.findByRole('table', { name: 'Quote requests' });
    expect(headers()).toEqual(['Request', 'Site', 'Wanted', 'Stage', 'Answers', 'Asked']);
    expect(cells('Request 8')[3]).toBe('Accepted');
    expect(cells('Request 8')[4]).toMatch(/^Tollerbeck Roofing Supplies, Tollerbeck Yard: .+ · £1,234\.56Tollerbeck Roofing Supplies, Cindermoor Depot: /);
    expect(screen.getByRole('link', { name: 'Request 8' }).getAttribute('href')).toBe('/quotes/8');
    expect(screen.queryByRole('checkbox')).toBeNull();
  });

  it("reads and sends the waiting filter only on the side that offers it, and words it in the side's empty state", async () => {
    const deskAsked: URLSearchParams[] = [];
    const first = renderWithProviders(<Harness side={desk} pages={onePage([])} asked={deskAsked} />, { path: '/desk/quotes?waiting=true&q=Kelder' });
    await screen.findByText('No quote request matches');
    expect(deskAsked.at(-1)?.get('waiting')).toBe('true');
    expect(screen.getByText(/^Showing/).textContent).toBe('Showing only those waiting for our price, search “Kelder”.');
    fireEvent.click(await screen.findByRole('checkbox', { name: 'Only those waiting for our price' }));
    await waitFor(() => expect(deskAsked.at(-1)?.has('waiting')).toBe(false));
    first.unmount();

    const firmAsked: URLSearchParams[] = [];
    renderWithProviders(<Harness side={firm} pages={onePage([])} asked={firmAsked} />, { path: '/quotes?waiting=true' });
    await screen.findByText('No quote requests yet');
    expect(screen.getByText('Ask a merchant to price an estimate.')).toBeTruthy();
    expect(firmAsked.every((q) => !q.has('waiting'))).toBe(true);
  });

  it('shows a failed load as an alert with a retry, on either side', async () => {
    let fail = true;
    const asked: URLSearchParams[] = [];
    renderWithProviders(<Harness side={firm} pages={() => (fail ? new Error('The list is not there') : onePage([priced])())} asked={asked} />, { path: '/quotes' });
    await screen.findByText('The quote requests could not be loaded');
    fail = false;
    fireEvent.click(screen.getByRole('button', { name: /try again/i }));
    await screen.findByRole('link', { name: 'Request 8' });
    expect(asked).toHaveLength(2);
  });
});
