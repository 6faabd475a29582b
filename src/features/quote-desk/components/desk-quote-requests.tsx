import { QuoteRequestList, quoteRequestColumns as c } from '../../../components/quotes/quote-request-list';
import type { QuoteRequestListSide } from '../../../components/quotes/quote-request-list';
import { useListAddress } from '../../../components/ui/server-list';
import { useDeskQuoteRequests } from '../api/get-desk-quote-requests';
import { deskFiltersFromSearch } from '../lib/list-filters';

/** The desk's side: who asked, and each of our branches' answers; only the desk filters on its own price. */
const DESK_SIDE: QuoteRequestListSide = {
  columns: c.layout([c.request('/desk/quotes'), c.contractor, c.site, c.wanted, c.answers({ id: 'answer', header: 'Your answer', minWidthClass: 'min-w-48', branchName: (quote) => quote.branch.name }), c.asked]),
  waitingLabel: 'Only those waiting for our price',
  waitingWords: 'only those waiting for our price',
  searchPlaceholder: '12 or Q-12, site, contractor or PO',
  minWidthClass: 'min-w-[52rem]',
  emptyText: 'When a contractor asks one of your branches to price an estimate, it shows here.',
};

/** Quote requests sent to the merchant's branches, with how each branch has answered: filtered, sorted and paged by the server. */
export function DeskQuoteRequests() {
  const filters = deskFiltersFromSearch(useListAddress().search);
  return <QuoteRequestList side={DESK_SIDE} filters={filters} requests={useDeskQuoteRequests(filters)} />;
}
