import { useId } from 'react';
import type { FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { ORDER_DATE_FIELDS, ORDER_SORTS, ORDER_STATUSES, ORDER_STATUS_LABELS, orderBookQuerySchema } from '../../../../shared/schemas/order.schema';
import type { OrderSummary } from '../../../../shared/schemas/order.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDate, formatMoney } from '../../../lib/format';
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

const SORT_LABELS: Record<(typeof ORDER_SORTS)[number], string> = {
  placed_at: 'Date placed',
  requested_date: 'Day wanted',
  status: 'Stage',
  subtotal: 'Subtotal',
  updated_at: 'Last change',
};

const PAGE_SIZES = [25, 50, 100];

const h = dataTableColumns<OrderSummary>();
// Sorting is the server's (over every matching order), so the columns do not re-sort one page.
const columns = h.columns([
  h.accessor('reference', {
    header: 'Order',
    enableSorting: false,
    cell: (info) => (
      <span className="block whitespace-nowrap">
        <Link to={`/desk/orders/${info.row.original.id}`} className="font-semibold text-clay-700 underline underline-offset-2">
          {info.getValue()}
        </Link>
        {info.row.original.po_reference ? <span className="block text-xs text-ink-600">PO {info.row.original.po_reference}</span> : null}
      </span>
    ),
  }),
  h.accessor((row) => row.contractor.name, { id: 'contractor', header: 'Contractor', enableSorting: false, cell: (info) => <span className="block min-w-36">{info.getValue()}</span> }),
  h.accessor((row) => row.project.name, { id: 'site', header: 'Site', enableSorting: false, cell: (info) => <span className="block min-w-36">{info.getValue()}</span> }),
  h.accessor((row) => row.branch.name, { id: 'branch', header: 'Branch', enableSorting: false }),
  h.accessor('requested_date', {
    header: 'Wanted',
    enableSorting: false,
    cell: (info) => (
      <span className="whitespace-nowrap">
        {formatDate(info.getValue())}
        <span className="block text-xs text-ink-600">{info.row.original.time_window ?? 'any time'}</span>
      </span>
    ),
  }),
  h.accessor('status', { header: 'Stage', enableSorting: false, cell: (info) => <DeskStatusBadge status={info.getValue()} /> }),
  h.accessor('line_count', { header: 'Lines', enableSorting: false, cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
  h.accessor('subtotal', { header: 'Subtotal', enableSorting: false, cell: (info) => <span className="whitespace-nowrap tabular-nums">{formatMoney(info.getValue())}</span> }),
  h.accessor('placed_at', { header: 'Placed', enableSorting: false, cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span> }),
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
  const [search, setSearch] = useSearchParams();
  const filters = filtersFromSearch(search);
  const orders = useOrderBook(filters);
  const branches = useDeskBranches();
  const id = useId();
  const set = (changes: Record<string, string | undefined>, resetPage = true) => {
    const next = new URLSearchParams(search);
    for (const [k, v] of Object.entries(changes)) if (v === undefined || v === '') next.delete(k);
    else next.set(k, v);
    if (resetPage) next.delete('page');
    setSearch(next, { replace: true });
  };
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
          <label htmlFor={`${id}-stage`} className="mb-1 block text-sm font-medium">Stage</label>
          <select id={`${id}-stage`} value={filters.statuses ?? ''} onChange={(e) => set({ statuses: e.target.value })} className={selectClass}>
            <option value="">Every stage</option>
            {STAGE_CHOICES.map((c) => (
              <option key={c.value} value={c.value}>{c.label}</option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor={`${id}-branch`} className="mb-1 block text-sm font-medium">Branch</label>
          <select id={`${id}-branch`} value={filters.branch_id ?? ''} onChange={(e) => set({ branch_id: e.target.value })} className={selectClass}>
            <option value="">Every branch</option>
            {(branches.data ?? []).map((b) => (
              <option key={b.id} value={b.id}>{b.name}</option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor={`${id}-sort`} className="mb-1 block text-sm font-medium">Sort by</label>
          <select id={`${id}-sort`} value={filters.sort} onChange={(e) => set({ sort: e.target.value })} className={selectClass}>
            {ORDER_SORTS.map((s) => (
              <option key={s} value={s}>{SORT_LABELS[s]}</option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor={`${id}-dir`} className="mb-1 block text-sm font-medium">Order</label>
          <select id={`${id}-dir`} value={filters.dir} onChange={(e) => set({ dir: e.target.value })} className={selectClass}>
            <option value="desc">Newest or largest first</option>
            <option value="asc">Oldest or smallest first</option>
          </select>
        </div>
        <div>
          <label htmlFor={`${id}-size`} className="mb-1 block text-sm font-medium">Per page</label>
          <select id={`${id}-size`} value={pageSize} onChange={(e) => set({ page_size: e.target.value })} className={selectClass}>
            {PAGE_SIZES.map((s) => (
              <option key={s} value={s}>{s}</option>
            ))}
          </select>
        </div>
      </div>
      <form role="search" onSubmit={onSearch} className="flex flex-wrap items-end gap-3" key={search.toString()}>
        <div className="min-w-56 flex-1">
          <label htmlFor={`${id}-q`} className="mb-1 block text-sm font-medium">Search orders</label>
          <input id={`${id}-q`} name="q" type="search" defaultValue={filters.q ?? ''} placeholder="RL-000123, PO, site or contractor" className={`${inputClass} w-full`} />
        </div>
        <div>
          <label htmlFor={`${id}-field`} className="mb-1 block text-sm font-medium">Dates of</label>
          <select id={`${id}-field`} value={filters.date_field} onChange={(e) => set({ date_field: e.target.value })} className={selectClass}>
            {ORDER_DATE_FIELDS.map((f) => (
              <option key={f} value={f}>{f === 'requested_date' ? 'Day wanted' : 'Day placed'}</option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor={`${id}-from`} className="mb-1 block text-sm font-medium">From</label>
          <input id={`${id}-from`} name="date_from" type="date" defaultValue={filters.date_from ?? ''} className={inputClass} />
        </div>
        <div>
          <label htmlFor={`${id}-to`} className="mb-1 block text-sm font-medium">To</label>
          <input id={`${id}-to`} name="date_to" type="date" defaultValue={filters.date_to ?? ''} className={inputClass} />
        </div>
        <Button type="submit" variant="secondary">Search</Button>
        {filtered ? (
          <Button variant="ghost" onClick={() => setSearch(new URLSearchParams(), { replace: true })}>
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
            {orders.isPlaceholderData ? ' · updating…' : ''}
          </p>
          <div className={orders.isPlaceholderData ? 'opacity-60' : ''}>
            <DataTable
              caption="Order book"
              captionHidden
              columns={columns}
              data={orders.data.orders}
              getRowId={(row) => String(row.id)}
              minWidthClass="min-w-[64rem]"
              empty={<EmptyState title={filtered ? 'No order matches' : 'No orders yet'}>{filtered ? 'Try another stage, branch, day or search.' : 'Orders from contractors arrive here.'}</EmptyState>}
            />
          </div>
          {pages > 1 ? (
            <nav aria-label="Pages of the order book" className="flex flex-wrap items-center gap-3">
              <Button variant="secondary" disabled={page <= 1} onClick={() => set({ page: String(page - 1) }, false)}>
                Previous page
              </Button>
              <span className="text-sm">
                Page {page} of {orders.data.total_capped ? `${pages}+` : pages}
              </span>
              <Button variant="secondary" disabled={page >= pages && !orders.data.total_capped} onClick={() => set({ page: String(page + 1) }, false)}>
                Next page
              </Button>
            </nav>
          ) : null}
        </>
      )}
    </section>
  );
}
