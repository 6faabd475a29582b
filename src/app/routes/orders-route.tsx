import { PageHeader } from '../../components/ui/page-header';
import { OrdersList } from '../../features/orders/components/orders-list';
import { usePageTitle } from '../../lib/use-page-title';

export function OrdersRoute() {
  usePageTitle('Orders');
  return (
    <>
      <PageHeader title="Orders" lead="Every order your firm has sent, and where each one stands." />
      <OrdersList />
    </>
  );
}
