import { lazy, Suspense, useId } from 'react';
import * as z from 'zod/mini';
import { orderBookQuerySchema } from '../../../../shared/schemas/order.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { ListPager, PhoneSortSelect, sortChoices, useListAddress } from '../../../components/ui/server-list';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useOrders } from '../api/get-orders';
import type { OrderStatus } from '../../../../shared/schemas/order.schema';
import { SearchBarLoading } from '../../../components/form/search-bar-loading';

/** The search bar (the form library with it) loads after the list's own code, while the orders are asked for. */
const OrderSearch = lazy(() => import('./order-search').then((m) => ({ default: m.OrderSearch })));
import { ORDERS_TABLE_SORTS, OrdersTable } from './orders-table';
import type { OrderSort } from './orders-table';

const PAGE_SIZE = 50;

type SortDir = 'asc' | 'desc';
type ListSort = (typeof ORDERS_TABLE_SORTS)[number];

/** Each sort of the list in words, both ways round; the phone's sort picker and the live count use them. */
const SORT_WORDS: Record<ListSort, Record<SortDir, string>> = {
  placed_at: { desc: 'newest placed first', asc: 'oldest placed first' },
  requested_date: { asc: 'soonest wanted first', desc: 'latest wanted first' },
  // The server orders stage codes as text: each stage comes together, in no order of progress.
  status: { asc: 'grouped by stage', desc: 'grouped by stage, reversed' },
  subtotal: { desc: 'largest subtotal first', asc: 'smallest subtotal first' },
};

const SORT_CHOICES = sortChoices(ORDERS_TABLE_SORTS, SORT_WORDS);

/** The list's state as the address holds it. */
export interface OrdersListState {
  status?: OrderStatus;
  q?: string;
  sort: ListSort;
  dir: SortDir;
  page: number;
}

const shape = orderBookQuerySchema.shape;
const isListSort = (sort: OrderSort): sort is ListSort => (ORDERS_TABLE_SORTS as readonly string[]).includes(sort);

/**
 * Reads the list's state from the address, each value as the server would read it. A value the
 * server would refuse (a typed or outdated address) falls back to its default alone, so one bad
 * page number does not throw away the stage and the sort.
 */
export function listStateFromSearch(search: URLSearchParams): OrdersListState {
  const read = <S extends z.core.$ZodType>(schema: S, key: string, fallback: z.output<S>): z.output<S> => {
    const parsed = z.safeParse(schema, search.get(key) ?? undefined);
    return parsed.success ? parsed.data : fallback;
  };
  const sort = read(shape.sort, 'sort', 'placed_at');
  return {
    status: read(shape.status, 'status', undefined),
    q: read(shape.q, 'q', undefined) || undefined,
    // A sort the table has no column for would leave every header unmarked, so it is not offered.
    sort: isListSort(sort) ? sort : 'placed_at',
    dir: read(shape.dir, 'dir', 'desc'),
    page: read(shape.page, 'page', 1),
  };
}

/** Every order of the firm, filtered by stage or searched by reference, PO, site or merchant; the server sorts and pages. */
export function OrdersList() {
  const id = useId();
  const { search, set } = useListAddress();
  const state = listStateFromSearch(search);
  const orders = useOrders({ ...state, page_size: PAGE_SIZE });
  /**
   * The address is the list's only state, so a reload or a shared link shows the same page. A new
   * sort or page is a step of its own in the history (Back returns to it); a filter replaces the step.
   */
  // Another order puts different orders on page 2, so a new sort starts again at page 1.
  const sortBy = (sort: OrderSort, dir: SortDir) => set({ sort, dir }, { step: true });
  const filtered = Boolean(state.status || state.q);
  const total = orders.data?.total ?? 0;
  const capped = orders.data?.total_capped ?? false;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const page = state.page;
  return (
    <section aria-label="Orders" className="space-y-4">
      <Suspense fallback={<SearchBarLoading label="Loading the search…" />}>
        <OrderSearch status={state.status} q={state.q} onSearch={(values) => set({ status: values.status, q: values.q })}>
          {/* On a phone most headers are off to the side of the scrolling table, so the sort is offered here too. */}
          <PhoneSortSelect id={`${id}-sort`} choices={SORT_CHOICES} sort={state.sort} dir={state.dir} onChoose={sortBy} labelClass="mb-1.5 block font-medium" />
        </OrderSearch>
      </Suspense>
      {orders.isPending ? (
        <SkeletonBlock label="Loading the orders" lines={5} />
      ) : orders.isError ? (
        <ErrorAlert error={orders.error} title="The orders could not be loaded" onRetry={() => void orders.refetch()} />
      ) : (
        <>
          <p className="text-sm text-ink-700" aria-live="polite">
            {capped ? `More than ${total.toLocaleString('en-GB')}` : total.toLocaleString('en-GB')} {total === 1 ? 'order' : 'orders'}
            {` · ${SORT_WORDS[state.sort][state.dir]}`}
            {orders.isPlaceholderData ? ' · updating…' : ''}
          </p>
          <div className={orders.isPlaceholderData ? 'opacity-60' : ''}>
            <OrdersTable
              orders={orders.data.orders}
              serverSorting={{ sorting: { id: state.sort, desc: state.dir === 'desc' }, sortable: ORDERS_TABLE_SORTS, onSortingChange: (next) => sortBy(next.id, next.desc ? 'desc' : 'asc') }}
              empty={<EmptyState title={filtered ? 'No order matches' : 'No orders yet'}>{filtered ? 'Try another stage or search.' : 'Orders are placed from a saved estimate.'}</EmptyState>}
            />
          </div>
          <ListPager label="Pages of the orders" page={page} pages={pages} capped={capped} onPage={(p) => set({ page: String(p) }, { resetPage: false, step: true })} />
        </>
      )}
    </section>
  );
}
