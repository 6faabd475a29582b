import { useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useDeskOrder } from '../../features/desk/api/get-desk-order';
import { DeskOrderDetail } from '../../features/desk/components/desk-order-detail';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

/** An order as the yard sees it while loading it: everything on the desk's page, nothing to change. */
export function YardOrderRoute() {
  const orderId = idParam(useParams(), 'orderId');
  const order = useDeskOrder(orderId);
  usePageTitle(order.data?.reference ?? 'Order');
  return (
    <>
      <TextLink to={order.data?.slot ? `/yard/runs/${order.data.slot.slot_id}` : '/yard'}>{order.data?.slot ? '← The run' : '← Day plan'}</TextLink>
      <PageQuery query={order} what="the order">
        {(found) => (
          <>
            <PageHeader title={`Order ${found.reference}`} lead={`${found.contractor.name} · ${found.project.name} · ${found.branch.name}`} />
            <DeskOrderDetail order={found} readOnly />
          </>
        )}
      </PageQuery>
    </>
  );
}
