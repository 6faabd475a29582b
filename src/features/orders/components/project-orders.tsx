import { ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useOrders } from '../api/get-orders';
import { OrdersTable } from './orders-table';

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
        <OrdersTable orders={orders.data.orders} caption="Orders of this site" empty={<EmptyState title="No orders for this site yet">Open an estimate to order its materials.</EmptyState>} />
      )}
    </Card>
  );
}
