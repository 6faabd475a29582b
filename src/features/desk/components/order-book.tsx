import { useId } from 'react';
import type { FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { ORDER_DATE_FIELDS, ORDER_SORTS, ORDER_STATUSES, ORDER_STATUS_LABELS, orderBookQuerySchema } from '../../../../shared/schemas/order.schema';
import type { OrderSummary } from '../../../../shared/schemas/order.schema';
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

/** Stage choices of the filter: the desk's to-do first, then each stage alone. */
const STAGE_CHOICES: { value: string; label: string }[] = [
  { value: 'sent,agreed', label: 'Waiting for the desk' },
  { value: 'confirmed,on_the_road', label: 'Confirmed, not yet delivered' },
  ...ORDER_STATUSES.map((s) => ({ value: s, label: ORDER_STATUS_LABELS[s] })),
];

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

const PAGE_SIZES = [25, 50, 100];

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

const selectClass = 'block min-h-tap rounded-md border border-ink-300 bg-white px-2';
const inputClass = 'block min-h-tap rounded-md border border-ink-300 bg-white px-3';

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
  const onSearch = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    set({ q: String(data.get('q') ?? '').trim(), date_from: String(data.get('date_from') ?? ''), date_to: String(data.get('date_to') ?? '') });
  };
  const pageSize = filters.page_size;
  const page = filters.page;
  const total = orders.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const filtered = Boolean(filters.statuses || filters.branch_id || filters.q || filters.date_from || filters.date_to);
  return (
    <section aria-label="Order book" className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor={`${id}-stage`} className="mb-1 block text-sm font-medium">
            Stage
          </label>
          <select id={`${id}-stage`} value={filters.statuses ?? ''} onChange={(e) => set({ statuses: e.target.value })} className={selectClass}>
            <option value="">Every stage</option>
            {STAGE_CHOICES.map((c) => (
              <option key={c.value} value={c.value}>
                {c.label}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor={`${id}-branch`} className="mb-1 block text-sm font-medium">
            Branch
          </label>
          <select id={`${id}-branch`} value={filters.branch_id ?? ''} onChange={(e) => set({ branch_id: e.target.value })} className={selectClass}>
            <option value="">Every branch</option>
            {(branches.data ?? []).map((b) => (
              <option key={b.id} value={b.id}>
                {b.name}
              </option>
            ))}
          </select>
        </div>
        {/* On a phone most headers are off to the side of the scrolling table, so the sort is offered here too. */}
        <PhoneSortSelect id={`${id}-sort`} choices={SORT_CHOICES} sort={filters.sort} dir={filters.dir} onChoose={sortBy} />
        <div>
          <label htmlFor={`${id}-size`} className="mb-1 block text-sm font-medium">
            Per page
          </label>
          <select id={`${id}-size`} value={pageSize} onChange={(e) => set({ page_size: e.target.value })} className={selectClass}>
            {PAGE_SIZES.map((s) => (
              <option key={s} value={s}>
                {s}
              </option>
            ))}
          </select>
        </div>
      </div>
      <form role="search" onSubmit={onSearch} className="flex flex-wrap items-end gap-3" key={[filters.q, filters.date_from, filters.date_to].join('|')}>
        <div className="min-w-56 flex-1">
          <label htmlFor={`${id}-q`} className="mb-1 block text-sm font-medium">
            Search orders
          </label>
          <input id={`${id}-q`} name="q" type="search" defaultValue={filters.q ?? ''} placeholder="RL-000123, PO, site or contractor" className={`${inputClass} w-full`} />
        </div>
        <div>
          <label htmlFor={`${id}-field`} className="mb-1 block text-sm font-medium">
            Dates of
          </label>
          <select id={`${id}-field`} value={filters.date_field} onChange={(e) => set({ date_field: e.target.value })} className={selectClass}>
            {ORDER_DATE_FIELDS.map((f) => (
              <option key={f} value={f}>
                {f === 'requested_date' ? 'Day wanted' : 'Day placed'}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor={`${id}-from`} className="mb-1 block text-sm font-medium">
            From
          </label>
          <input id={`${id}-from`} name="date_from" type="date" defaultValue={filters.date_from ?? ''} className={inputClass} />
        </div>
        <div>
          <label htmlFor={`${id}-to`} className="mb-1 block text-sm font-medium">
            To
          </label>
          <input id={`${id}-to`} name="date_to" type="date" defaultValue={filters.date_to ?? ''} className={inputClass} />
        </div>
        <Button type="submit" variant="secondary">
          Search
        </Button>
        {filtered ? (
          <Button variant="ghost" onClick={() => setSearch(keepListOrder(search), { replace: true })}>
            Clear the filters
          </Button>
        ) : null}
      </form>
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
