import { lazy, Suspense, useId } from 'react';
import { Link } from 'react-router-dom';
import { ORDER_SORTS, orderBookQuerySchema } from '../../../../shared/schemas/order.schema';
import type { OrderSummary } from '../../../../shared/schemas/order.schema';
import type { OrderBookSearch as OrderBookSearchValues } from '../../../../shared/schemas/list-search.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { ListPager, PhoneSortSelect, keepListOrder, sortChoices, useListAddress } from '../../../components/ui/server-list';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatCount, formatDate, formatMoney } from '../../../lib/format';
import { useDeskBranches } from '../api/get-desk-branches';
import { useOrderBook } from '../api/get-order-book';
import type { OrderBookFilters } from '../api/keys';
import { DeskStatusBadge } from './desk-status-badge';
import { SearchBarLoading } from '../../../components/form/search-bar-loading';

/** The search bar (the form library with it) loads after the order book's own code, while the orders are asked for. */
const OrderBookSearch = lazy(() => import('./order-book-search').then((m) => ({ default: m.OrderBookSearch })));

type OrderSort = (typeof ORDER_SORTS)[number];
type SortDir = OrderBookFilters['dir'];

/** Each server sort in words, both ways round; the phone's sort picker and the live count use them. */
const SORT_WORDS: Record<OrderSort, Record<SortDir, string>> = {
  placed_at: { desc: 'newest placed first', asc: 'oldest placed first' },
  requested_date: { asc: 'soonest wanted first', desc: 'latest wanted first' },
  // The server orders stage codes as text, which groups each stage together in no business order.
  status: { asc: 'grouped by stage', desc: 'grouped by stage, reversed' },
  subtotal: { desc: 'largest subtotal first', asc: 'smallest subtotal first' },
  updated_at: { desc: 'latest change first', asc: 'oldest change first' },
};

const SORT_CHOICES = sortChoices(ORDER_SORTS, SORT_WORDS);

const h = dataTableColumns<OrderSummary>();
// Sorting is the server's (over every matching order, not one page): column ids that match an
// ORDER_SORTS name get a header button, and the table itself never reorders rows.
const columns = h.columns([
  h.accessor('reference', {
    header: 'Order',
    cell: (info) => (
      <span className="block whitespace-nowrap">
        <Link to={`/desk/orders/${info.row.original.id}`} className="font-semibold text-clay-700 underline underline-offset-2">
          {info.getValue()}
        </Link>
        {info.row.original.po_reference ? <span className="block text-xs text-ink-600">PO {info.row.original.po_reference}</span> : null}
      </span>
    ),
  }),
  h.accessor((row) => row.contractor.name, { id: 'contractor', header: 'Contractor', cell: (info) => <span className="block min-w-36">{info.getValue()}</span> }),
  h.accessor((row) => row.project.name, { id: 'site', header: 'Site', cell: (info) => <span className="block min-w-36">{info.getValue()}</span> }),
  h.accessor((row) => row.branch.name, { id: 'branch', header: 'Branch' }),
  h.accessor('requested_date', {
    header: 'Wanted',
    cell: (info) => (
      <span className="whitespace-nowrap">
        {formatDate(info.getValue())}
        <span className="block text-xs text-ink-600">{info.row.original.time_window ?? 'any time'}</span>
      </span>
    ),
  }),
  h.accessor('status', { header: 'Stage', cell: (info) => <DeskStatusBadge status={info.getValue()} /> }),
  h.accessor('line_count', { header: 'Lines', cell: (info) => <span className="tabular-nums">{formatCount(info.getValue())}</span> }),
  h.accessor('subtotal', { header: 'Subtotal', cell: (info) => <span className="whitespace-nowrap tabular-nums">{formatMoney(info.getValue())}</span> }),
  h.accessor('placed_at', { header: 'Placed', sortDescFirst: true, cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span> }),
  h.accessor('updated_at', { header: 'Last change', sortDescFirst: true, cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span> }),
]);

/** The filters as the address holds them; anything the server would refuse falls back to its default. */
export function filtersFromSearch(search: URLSearchParams): OrderBookFilters {
  const raw = Object.fromEntries(search.entries());
  const parsed = orderBookQuerySchema.safeParse(raw);
  const value = parsed.success ? parsed.data : orderBookQuerySchema.parse({});
  return {
    statuses: raw.statuses && parsed.success ? raw.statuses : undefined,
    branch_id: value.branch_id,
    q: value.q || undefined,
    sort: value.sort,
    dir: value.dir,
    page: value.page,
    page_size: value.page_size,
    date_from: value.date_from,
    date_to: value.date_to,
    date_field: value.date_field,
  };
}

/** The merchant's order book: every order to its branches, filtered, sorted and paged by the server. */
export function OrderBook() {
  const { search, setSearch, set } = useListAddress();
  const filters = filtersFromSearch(search);
  const orders = useOrderBook(filters);
  const branches = useDeskBranches();
  const id = useId();
  /**
   * The address is the order book's only state. A new sort or page is a step of its own in the
   * history (Back returns to it); typing in the filters replaces the current step.
   */
  // Another order puts a different set of orders on page 2, so a new sort starts again at page 1.
  const sortBy = (sort: OrderSort, dir: SortDir) => set({ sort, dir }, { step: true });
  // The defaults (25 a page, dates of the day wanted) stay out of the address.
  const onSearch = (values: OrderBookSearchValues) =>
    set({
      statuses: values.statuses,
      branch_id: values.branch_id,
      page_size: values.page_size === '25' ? undefined : values.page_size,
      q: values.q,
      date_field: values.date_field === 'requested_date' ? undefined : values.date_field,
      date_from: values.date_from,
      date_to: values.date_to,
    });
  const pageSize = filters.page_size;
  const page = filters.page;
  const total = orders.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const filtered = Boolean(filters.statuses || filters.branch_id || filters.q || filters.date_from || filters.date_to);
  return (
    <section aria-label="Order book" className="space-y-4">
      <Suspense fallback={<SearchBarLoading label="Loading the search…" />}>
        <OrderBookSearch
          address={{
            statuses: filters.statuses ?? '',
            branch_id: filters.branch_id ? String(filters.branch_id) : '',
            page_size: String(pageSize),
            q: filters.q ?? '',
            date_field: filters.date_field,
            date_from: filters.date_from ?? '',
            date_to: filters.date_to ?? '',
          }}
          branches={branches.data ?? []}
          onSearch={onSearch}
          // On a phone most headers are off to the side of the scrolling table, so the sort is offered here too.
          sortPicker={<PhoneSortSelect id={`${id}-sort`} choices={SORT_CHOICES} sort={filters.sort} dir={filters.dir} onChoose={sortBy} />}
          clear={
            filtered ? (
              <Button variant="ghost" onClick={() => setSearch(keepListOrder(search), { replace: true })}>
                Clear the filters
              </Button>
            ) : null
          }
        />
      </Suspense>
      {orders.isPending ? (
        <SkeletonBlock label="Loading the order book" lines={8} />
      ) : orders.isError ? (
        <ErrorAlert error={orders.error} title="The order book could not be loaded" onRetry={() => void orders.refetch()} />
      ) : (
        <>
          <p className="text-sm text-ink-700" aria-live="polite">
            {orders.data.total_capped ? `More than ${total.toLocaleString('en-GB')}` : total.toLocaleString('en-GB')} {total === 1 ? 'order' : 'orders'}
            {` · ${SORT_WORDS[filters.sort][filters.dir]}`}
            {orders.isPlaceholderData ? ' · updating…' : ''}
          </p>
          <div className={orders.isPlaceholderData ? 'opacity-60' : ''}>
            <DataTable
              caption="Order book"
              captionHidden
              columns={columns}
              data={orders.data.orders}
              getRowId={(row) => String(row.id)}
              serverSorting={{ sorting: { id: filters.sort, desc: filters.dir === 'desc' }, sortable: ORDER_SORTS, onSortingChange: (next) => sortBy(next.id, next.desc ? 'desc' : 'asc') }}
              minWidthClass="min-w-[70rem]"
              empty={<EmptyState title={filtered ? 'No order matches' : 'No orders yet'}>{filtered ? 'Try another stage, branch, day or search.' : 'Orders from contractors arrive here.'}</EmptyState>}
            />
          </div>
          <ListPager label="Pages of the order book" page={page} pages={pages} capped={orders.data.total_capped} onPage={(p) => set({ page: String(p) }, { resetPage: false, step: true })} />
        </>
      )}
    </section>
  );
}
