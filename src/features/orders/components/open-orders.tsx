import { Link } from 'react-router-dom';
import { ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { TextLink } from '../../../components/ui/text-link';
import { formatDate } from '../../../lib/format';
import { useOrders } from '../api/get-orders';
import { OPEN_STATUSES, OrderStatusBadge } from './order-status';

/** Orders still on their way, soonest first, with the ones waiting on the contractor at the top. */
export function OpenOrders({ limit = 6 }: { limit?: number }) {
  const orders = useOrders({ sort: 'requested_date', dir: 'asc', page_size: 100 });
  const open = (orders.data?.orders ?? [])
    .filter((o) => OPEN_STATUSES.includes(o.status))
    .sort((a, b) => Number(b.status === 'changes_offered') - Number(a.status === 'changes_offered'))
    .slice(0, limit);
  return (
    <Card title="Open orders">
      {orders.isPending ? (
        <SkeletonBlock label="Loading the open orders" lines={4} />
      ) : orders.isError ? (
        <ErrorAlert error={orders.error} title="The orders could not be loaded" onRetry={() => void orders.refetch()} />
      ) : open.length === 0 ? (
        <EmptyState title="No open orders">Orders you send appear here until they are delivered.</EmptyState>
      ) : (
        <ul className="divide-y divide-mortar-200">
          {open.map((order) => (
            <li key={order.id} className="flex flex-wrap items-center justify-between gap-x-4 gap-y-1 py-2">
              <span>
                <Link to={`/orders/${order.id}`} className="inline-flex min-h-tap items-center font-semibold text-clay-700 underline underline-offset-2">
                  {order.reference}
                </Link>
                <span className="block text-sm text-ink-600">
                  {order.project.name} · {order.branch.name} · {formatDate(order.requested_date)}
                  {order.time_window ? ` ${order.time_window}` : ''}
                </span>
              </span>
              <OrderStatusBadge status={order.status} />
            </li>
          ))}
        </ul>
      )}
      <div className="mt-3">
        <TextLink to="/orders">All orders</TextLink>
      </div>
    </Card>
  );
}
