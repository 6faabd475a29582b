import { useId } from 'react';
import { Link } from 'react-router-dom';
import type { z } from 'zod';
import { QUOTE_REQUEST_SORTS, type QUOTE_REQUEST_STATUSES, QUOTE_STATUS_LABELS } from '../../../../shared/schemas/order.schema';
import type { quoteRequestListSchema } from '../../../../shared/schemas/order.schema';
import { QuoteRequestSearch } from '../../../components/quotes/quote-request-search';
import { ErrorAlert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { ListPager, PhoneSortSelect, keepListOrder, sortChoices, useListAddress } from '../../../components/ui/server-list';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDate, formatMoney } from '../../../lib/format';
import { useDeskQuoteRequests } from '../api/get-desk-quote-requests';
import type { DeskQuoteRequestFilters } from '../api/keys';
import { deskFiltersFromSearch } from '../lib/list-filters';

type Row = z.infer<typeof quoteRequestListSchema>['quote_requests'][number];
type RequestStatus = (typeof QUOTE_REQUEST_STATUSES)[number];
type RequestSort = (typeof QUOTE_REQUEST_SORTS)[number];
type SortDir = DeskQuoteRequestFilters['dir'];

const STAGE_WORDS: Record<RequestStatus, string> = { open: 'Open', accepted: 'Accepted', withdrawn: 'Withdrawn' };

/** Each server sort in words, both ways round; the phone's sort picker and the count line use them. */
const SORT_WORDS: Record<RequestSort, Record<SortDir, string>> = {
  created_at: { desc: 'newest asked first', asc: 'oldest asked first' },
  requested_date: { asc: 'soonest wanted first', desc: 'latest wanted first' },
};

const SORT_CHOICES = sortChoices(QUOTE_REQUEST_SORTS, SORT_WORDS);

const helper = dataTableColumns<Row>();
// Sorting is the server's (over every matching request, not one page): the column ids that match a
// QUOTE_REQUEST_SORTS name get a header button, and the table itself never reorders rows.
const columns = helper.columns([
  helper.accessor('id', {
    header: 'Request',
    cell: (info) => (
      <Link to={`/desk/quotes/${info.getValue()}`} className="font-semibold whitespace-nowrap text-clay-700 underline underline-offset-2">
        Request {info.getValue()}
      </Link>
    ),
  }),
  helper.accessor((row) => row.contractor.name, { id: 'contractor', header: 'Contractor' }),
  helper.accessor((row) => row.project.name, { id: 'site', header: 'Site' }),
  helper.accessor('requested_date', { header: 'Wanted', cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span> }),
  helper.display({
    id: 'answer',
    header: 'Your answer',
    cell: (info) => (
      <ul className="min-w-48 space-y-0.5 text-sm">
        {info.row.original.quotes.map((quote) => (
          <li key={quote.id}>
            {quote.branch.name}: {QUOTE_STATUS_LABELS[quote.status]}
            {quote.total !== null ? ` · ${formatMoney(quote.total)}` : ''}
          </li>
        ))}
      </ul>
    ),
  }),
  helper.accessor('created_at', { header: 'Asked', sortDescFirst: true, cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span> }),
]);

/** The filters in force, in words, for the empty state: the desk should see why the list is empty. */
function filterWords(filters: DeskQuoteRequestFilters): string[] {
  return [filters.status ? `stage ${STAGE_WORDS[filters.status]}` : '', filters.waiting ? 'only those waiting for our price' : '', filters.q ? `search “${filters.q}”` : ''].filter(Boolean);
}

/** Quote requests sent to the merchant's branches, with how each branch has answered: filtered, sorted and paged by the server. */
export function DeskQuoteRequests() {
  const { search, setSearch, set: setAddress } = useListAddress();
  const filters = deskFiltersFromSearch(search);
  const requests = useDeskQuoteRequests(filters);
  const id = useId();
  /**
   * The address is the list's only state, and every change is a step of its own in the history, so
   * Back returns to the previous filter, sort or page. A new filter or sort puts other requests on
   * page 2, so it starts again at page 1.
   */
  const set = (changes: Record<string, string | undefined>, { resetPage = true } = {}) => setAddress(changes, { resetPage, step: true });
  const sortBy = (sort: RequestSort, dir: SortDir) => set({ sort, dir });
  const goToPage = (page: number) => set({ page: page > 1 ? String(page) : undefined }, { resetPage: false });

  const words = filterWords(filters);
  const filtered = words.length > 0;
  const page = filters.page;
  const total = requests.data?.total ?? 0;
  const rows = requests.data?.quote_requests ?? [];
  const pages = Math.max(1, Math.ceil(total / (requests.data?.page_size ?? filters.page_size)));
  // A page the list no longer reaches (requests closed since the link was made) is not "no requests".
  const pastTheEnd = rows.length === 0 && total > 0;

  return (
    <section aria-label="Quote requests" className="space-y-4">
      <QuoteRequestSearch
        status={filters.status}
        q={filters.q}
        waiting={filters.waiting === true}
        placeholder="12 or Q-12, site, contractor or PO"
        onSearch={(values) => set({ status: values.status, waiting: values.waiting, q: values.q })}
        // On a phone the Asked header is off to the side of the scrolling table, so the sort is offered here too.
        sortPicker={<PhoneSortSelect id={`${id}-sort`} choices={SORT_CHOICES} sort={filters.sort} dir={filters.dir} onChoose={sortBy} />}
        clear={
          filtered ? (
            <Button variant="ghost" onClick={() => setSearch(keepListOrder(search))}>
              Clear the filters
            </Button>
          ) : null
        }
      />
      {requests.isPending ? (
        <SkeletonBlock label="Loading the quote requests" lines={4} />
      ) : requests.isError ? (
        <ErrorAlert error={requests.error} title="The quote requests could not be loaded" onRetry={() => void requests.refetch()} />
      ) : (
        <>
          <p className="text-sm text-ink-700" aria-live="polite">
            {total.toLocaleString('en-GB')} {total === 1 ? 'request' : 'requests'}
            {` · ${SORT_WORDS[filters.sort][filters.dir]}`}
            {requests.isPlaceholderData ? ' · updating…' : ''}
          </p>
          <div className={requests.isPlaceholderData ? 'opacity-60' : ''}>
            <DataTable
              caption="Quote requests"
              captionHidden
              columns={columns}
              data={rows}
              getRowId={(row) => String(row.id)}
              serverSorting={{ sorting: { id: filters.sort, desc: filters.dir === 'desc' }, sortable: QUOTE_REQUEST_SORTS, onSortingChange: (next) => sortBy(next.id, next.desc ? 'desc' : 'asc') }}
              minWidthClass="min-w-[52rem]"
              empty={
                pastTheEnd ? (
                  <EmptyState
                    title={`Nothing on page ${page}`}
                    action={
                      <Button variant="secondary" onClick={() => goToPage(pages)}>
                        Go to page {pages}
                      </Button>
                    }
                  >
                    The list has {pages === 1 ? 'one page' : `${pages} pages`} now.
                  </EmptyState>
                ) : filtered ? (
                  <EmptyState
                    title="No quote request matches"
                    action={
                      <Button variant="secondary" onClick={() => setSearch(keepListOrder(search))}>
                        Clear the filters
                      </Button>
                    }
                  >
                    Showing {words.join(', ')}.
                  </EmptyState>
                ) : (
                  <EmptyState title="No quote requests yet">When a contractor asks one of your branches to price an estimate, it shows here.</EmptyState>
                )
              }
            />
          </div>
          <ListPager label="Pages of the quote requests" page={page} pages={pages} onPage={goToPage} />
        </>
      )}
    </section>
  );
}
