import { lazy, Suspense, useId } from 'react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { UseQueryResult } from '@tanstack/react-query';
import { QUOTE_REQUEST_SORTS, QUOTE_STATUS_LABELS } from '../../../shared/schemas/order.schema';
import type { QuoteRequestList as QuoteRequestListPage } from '../../../shared/schemas/order.schema';
import { ErrorAlert } from '../ui/alert';
import { Button } from '../ui/button';
import { ListPager, PhoneSortSelect, keepListOrder, sortChoices, useListAddress } from '../ui/server-list';
import { DataTable, dataTableColumns } from '../ui/data-table';
import type { DataTableColumn } from '../ui/data-table';
import { EmptyState } from '../ui/empty-state';
import { SkeletonBlock } from '../ui/skeleton';
import { formatDate, formatMoney } from '../../lib/format';
import type { QuoteRequestListFilters } from './list-filters';
import { REQUEST_STAGE_WORDS } from './request-stage-words';
import { SearchBarLoading } from '../form/search-bar-loading';

/** The search bar (the form library with it) loads after the list's own code, while the requests are asked for. */
const QuoteRequestSearch = lazy(() => import('./quote-request-search').then((m) => ({ default: m.QuoteRequestSearch })));

export type QuoteRequestRow = QuoteRequestListPage['quote_requests'][number];
type RequestSort = (typeof QUOTE_REQUEST_SORTS)[number];
type SortDir = QuoteRequestListFilters['dir'];
type Quote = QuoteRequestRow['quotes'][number];

export { REQUEST_STAGE_WORDS };

/** Each server sort in words, both ways round; the phone's sort picker and the count line use them. */
const SORT_WORDS: Record<RequestSort, Record<SortDir, string>> = {
  created_at: { desc: 'newest asked first', asc: 'oldest asked first' },
  requested_date: { asc: 'soonest wanted first', desc: 'latest wanted first' },
};

const SORT_CHOICES = sortChoices(QUOTE_REQUEST_SORTS, SORT_WORDS);

const helper = dataTableColumns<QuoteRequestRow>();

/**
 * The columns both sides show, for a side to lay out with its own. Sorting is the server's (over every
 * matching request, not one page): the column ids that match a QUOTE_REQUEST_SORTS name get a header
 * button, and the table itself never reorders rows.
 */
export const quoteRequestColumns = {
  /** A side's columns in its order, each keeping its own value type. */
  layout: helper.columns,
  /** The request's number, linking to `${detailPath}/${id}`. */
  request: (detailPath: string) =>
    helper.accessor('id', {
      header: 'Request',
      cell: (info) => (
        <Link to={`${detailPath}/${info.getValue()}`} className="font-semibold whitespace-nowrap text-clay-700 underline underline-offset-2">
          Request {info.getValue()}
        </Link>
      ),
    }),
  contractor: helper.accessor((row) => row.contractor.name, { id: 'contractor', header: 'Contractor' }),
  site: helper.accessor((row) => row.project.name, { id: 'site', header: 'Site' }),
  wanted: helper.accessor('requested_date', { header: 'Wanted', cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span> }),
  stage: helper.accessor('status', { header: 'Stage', cell: (info) => REQUEST_STAGE_WORDS[info.getValue()] }),
  /** Each branch's answer and total, the branch named as `branchName` gives it. */
  answers: ({ id, header, minWidthClass, branchName }: { id: string; header: string; minWidthClass: string; branchName: (quote: Quote) => string }) =>
    helper.display({
      id,
      header,
      cell: (info) => (
        <ul className={`${minWidthClass} space-y-0.5 text-sm`}>
          {info.row.original.quotes.map((quote) => (
            <li key={quote.id}>
              {branchName(quote)}: {QUOTE_STATUS_LABELS[quote.status]}
              {quote.total !== null ? ` · ${formatMoney(quote.total)}` : ''}
            </li>
          ))}
        </ul>
      ),
    }),
  asked: helper.accessor('created_at', { header: 'Asked', sortDescFirst: true, cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span> }),
};

/** What one side of the trade shows in the list: its columns, its filters and its words. */
export interface QuoteRequestListSide {
  columns: readonly DataTableColumn<QuoteRequestRow>[];
  /** The "only those waiting for our price" box's label, for the side that prices; none, no box. */
  waitingLabel?: string;
  /** The waiting filter as the empty state words it. */
  waitingWords?: string;
  searchPlaceholder: string;
  minWidthClass: string;
  /** What to do when there are no requests at all. */
  emptyText: ReactNode;
}

/** The filters in force, in words, for the empty state: whoever reads the list should see why it is empty. */
function filterWords(filters: QuoteRequestListFilters, side: QuoteRequestListSide): string[] {
  return [filters.status ? `stage ${REQUEST_STAGE_WORDS[filters.status]}` : '', filters.waiting && side.waitingWords ? side.waitingWords : '', filters.q ? `search “${filters.q}”` : ''].filter(Boolean);
}

/**
 * Quote requests, filtered, sorted and paged by the server, as either side of the trade reads them:
 * the contractor's firm (its requests and every merchant's answer) or the merchant's desk (requests
 * sent to its branches and its own answers). The side gives the columns and words; the page gives the
 * filters read from the address and the query that fetched them.
 */
export function QuoteRequestList({ side, filters, requests }: { side: QuoteRequestListSide; filters: QuoteRequestListFilters; requests: UseQueryResult<QuoteRequestListPage> }) {
  const { search, setSearch, set: setAddress } = useListAddress();
  const id = useId();
  /**
   * The address is the list's only state, and every change is a step of its own in the history, so
   * Back returns to the previous filter, sort or page. A new filter or sort puts other requests on
   * page 2, so it starts again at page 1.
   */
  const set = (changes: Record<string, string | undefined>, { resetPage = true } = {}) => setAddress(changes, { resetPage, step: true });
  const sortBy = (sort: RequestSort, dir: SortDir) => set({ sort, dir });
  const goToPage = (page: number) => set({ page: page > 1 ? String(page) : undefined }, { resetPage: false });

  const words = filterWords(filters, side);
  const filtered = words.length > 0;
  const page = filters.page;
  const total = requests.data?.total ?? 0;
  const rows = requests.data?.quote_requests ?? [];
  const pages = Math.max(1, Math.ceil(total / (requests.data?.page_size ?? filters.page_size)));
  // A page the list no longer reaches (requests closed since the link was made) is not "no requests".
  const pastTheEnd = rows.length === 0 && total > 0;

  return (
    <section aria-label="Quote requests" className="space-y-4">
      <Suspense fallback={<SearchBarLoading label="Loading the search…" />}>
        <QuoteRequestSearch
          status={filters.status}
          q={filters.q}
          waiting={side.waitingLabel ? filters.waiting === true : undefined}
          waitingLabel={side.waitingLabel}
          placeholder={side.searchPlaceholder}
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
      </Suspense>
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
              columns={side.columns}
              data={rows}
              getRowId={(row) => String(row.id)}
              serverSorting={{ sorting: { id: filters.sort, desc: filters.dir === 'desc' }, sortable: QUOTE_REQUEST_SORTS, onSortingChange: (next) => sortBy(next.id, next.desc ? 'desc' : 'asc') }}
              minWidthClass={side.minWidthClass}
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
                  <EmptyState title="No quote requests yet">{side.emptyText}</EmptyState>
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
