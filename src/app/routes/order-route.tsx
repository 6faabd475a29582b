import { useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useOrder } from '../../features/orders/api/get-order';
import { DeliveryProofCard } from '../../features/orders/components/delivery-proof';
import { OrderDetail } from '../../features/orders/components/order-detail';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function OrderRoute() {
  const orderId = idParam(useParams(), 'orderId');
  const order = useOrder(orderId);
  usePageTitle(order.data?.reference ?? 'Order');
  return (
    <>
      <TextLink to="/orders">← Orders</TextLink>
      <PageQuery query={order} what="the order">
        {(found) => (
          <>
            <PageHeader title={`Order ${found.reference}`} lead={`${found.project.name} · ${found.branch.merchant.name}, ${found.branch.name}`} />
            <OrderDetail order={found} />
            <DeliveryProofCard orderId={found.id} status={found.status} />
          </>
        )}
      </PageQuery>
    </>
  );
}
