import { QuoteRequestList, quoteRequestColumns as c } from '../../../components/quotes/quote-request-list';
import type { QuoteRequestListSide } from '../../../components/quotes/quote-request-list';
import { useListAddress } from '../../../components/ui/server-list';
import { useQuoteRequests } from '../api/get-quote-requests';
import { quoteFiltersFromSearch } from '../lib/list-filters';

/** The firm's side: each request's stage and every merchant's answer. */
const FIRM_SIDE: QuoteRequestListSide = {
  columns: c.layout([
    c.request('/quotes'),
    c.site,
    c.wanted,
    c.stage,
    c.answers({ id: 'quotes', header: 'Answers', minWidthClass: 'min-w-56', branchName: (quote) => `${quote.branch.merchant.name}, ${quote.branch.name}` }),
    c.asked,
  ]),
  searchPlaceholder: '12 or Q-12, site or PO',
  minWidthClass: 'min-w-[48rem]',
  emptyText: <>Ask up to three merchants to price an estimate from the estimate&rsquo;s page.</>,
};

/** The firm's quote requests and how each merchant has answered: filtered, sorted and paged by the server. */
export function QuoteRequestsList() {
  const filters = quoteFiltersFromSearch(useListAddress().search);
  return <QuoteRequestList side={FIRM_SIDE} filters={filters} requests={useQuoteRequests(filters)} />;
}
