import { lazy, Suspense } from 'react';
import { useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { SkeletonBlock } from '../../components/ui/skeleton';
import { TextLink } from '../../components/ui/text-link';
import { useOrder } from '../../features/orders/api/get-order';
import { OrderDetail } from '../../features/orders/components/order-detail';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

// Only a delivered order has a proof of delivery: its card (with the runs' schemas it reads) loads for that order alone (DEVELOPERS.md, decision 37).
const DeliveryProofCard = lazy(() => import('../../features/orders/components/delivery-proof').then((m) => ({ default: m.DeliveryProofCard })));

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
            {found.status === 'delivered' ? (
              <Suspense fallback={<SkeletonBlock label="Loading the proof of delivery" lines={3} className="mt-6" />}>
                <DeliveryProofCard orderId={found.id} status={found.status} />
              </Suspense>
            ) : null}
          </>
        )}
      </PageQuery>
    </>
  );
}
