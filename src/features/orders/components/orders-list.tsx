import { useId, useMemo, useState } from 'react';
import { ORDER_STATUSES, ORDER_STATUS_LABELS } from '../../../../shared/schemas/order.schema';
import type { OrderStatus } from '../../../../shared/schemas/order.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useOrders } from '../api/get-orders';
import { OrdersTable } from './orders-table';

const PAGE_SIZE = 50;

/** Every order of the firm, newest first, filtered by stage or searched by reference, PO, site or merchant. */
export function OrdersList() {
  const statusId = useId();
  const searchId = useId();
  const [status, setStatus] = useState<OrderStatus | ''>('');
  const [search, setSearch] = useState('');
  const [q, setQ] = useState('');
  const [page, setPage] = useState(1);
  const filters = useMemo(() => ({ status: status || undefined, q: q || undefined, page, page_size: PAGE_SIZE }), [status, q, page]);
  const orders = useOrders(filters);
  const pages = orders.data ? Math.max(1, Math.ceil(orders.data.total / PAGE_SIZE)) : 1;
  return (
    <section aria-label="Orders" className="space-y-4">
      <form
        role="search"
        className="flex flex-wrap items-end gap-4"
        onSubmit={(event) => {
          event.preventDefault();
          setQ(search.trim());
          setPage(1);
        }}
      >
        <div>
          <label htmlFor={statusId} className="mb-1.5 block font-medium">
            Stage
          </label>
          <select
            id={statusId}
            value={status}
            onChange={(event) => {
              setStatus(event.target.value as OrderStatus | '');
              setPage(1);
            }}
            className="block min-h-tap rounded-md border border-ink-300 bg-white px-2"
          >
            <option value="">Every stage</option>
            {ORDER_STATUSES.map((s) => (
              <option key={s} value={s}>
                {ORDER_STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <div className="min-w-56 flex-1">
          <label htmlFor={searchId} className="mb-1.5 block font-medium">
            Search orders
          </label>
          <input
            id={searchId}
            type="search"
            value={search}
            placeholder="RL-000123, PO, site or merchant"
            onChange={(event) => setSearch(event.target.value)}
            className="block min-h-tap w-full rounded-md border border-ink-300 bg-white px-3"
          />
        </div>
        <Button type="submit" variant="secondary">
          Search
        </Button>
      </form>
      {orders.isPending ? (
        <SkeletonBlock label="Loading the orders" lines={5} />
      ) : orders.isError ? (
        <ErrorAlert error={orders.error} title="The orders could not be loaded" onRetry={() => void orders.refetch()} />
      ) : (
        <>
          <OrdersTable
            orders={orders.data.orders}
            empty={<EmptyState title={status || q ? 'No order matches' : 'No orders yet'}>{status || q ? 'Try another stage or search.' : 'Orders are placed from a saved estimate.'}</EmptyState>}
          />
          {pages > 1 ? (
            <div className="flex flex-wrap items-center gap-3">
              <Button variant="secondary" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
                Previous page
              </Button>
              <span className="text-sm">
                Page {page} of {pages}
              </span>
              <Button variant="secondary" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
                Next page
              </Button>
            </div>
          ) : null}
        </>
      )}
    </section>
  );
}
