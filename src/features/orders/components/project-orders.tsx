import { lazy, Suspense } from 'react';
import { ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useOrders } from '../api/get-orders';

// The site's orders sit at the foot of its page: their table's code is asked for while the orders are
// (DEVELOPERS.md, decision 37).
const OrdersTable = lazy(() => import('./orders-table').then((m) => ({ default: m.OrdersTable })));

/** The orders of one site. */
export function ProjectOrders({ projectId }: { projectId: number }) {
  const orders = useOrders({ project_id: projectId, page_size: 100 });
  return (
    <Card title="Orders">
      {orders.isPending ? (
        <SkeletonBlock label="Loading the site’s orders" lines={3} />
      ) : orders.isError ? (
        <ErrorAlert error={orders.error} title="The orders could not be loaded" onRetry={() => void orders.refetch()} />
      ) : orders.data.orders.length === 0 ? (
        <EmptyState title="No orders for this site yet">Open an estimate to order its materials.</EmptyState>
      ) : (
        <Suspense fallback={<SkeletonBlock label="Loading the site’s orders" lines={3} />}>
          <OrdersTable orders={orders.data.orders} caption="Orders of this site" empty={<EmptyState title="No orders for this site yet">Open an estimate to order its materials.</EmptyState>} />
        </Suspense>
      )}
    </Card>
  );
}
