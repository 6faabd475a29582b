import { useQueryClient } from '@tanstack/react-query';
import { useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useDeskOrder } from '../../features/desk/api/get-desk-order';
import { deskKeys } from '../../features/desk/api/keys';
import { DeskOrderDetail } from '../../features/desk/components/desk-order-detail';
import { IssueInvoiceButton } from '../../features/invoices/components/issue-invoice-button';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function DeskOrderRoute() {
  const orderId = idParam(useParams(), 'orderId');
  const order = useDeskOrder(orderId);
  const queryClient = useQueryClient();
  usePageTitle(order.data?.reference ?? 'Order');
  return (
    <>
      <TextLink to="/desk/orders">← Order book</TextLink>
      <PageQuery query={order} what="the order">
        {(found) => (
          <>
            <PageHeader title={`Order ${found.reference}`} lead={`${found.contractor.name} · ${found.project.name} · ${found.branch.name}`} />
            <DeskOrderDetail
              order={found}
              invoiceAction={<IssueInvoiceButton orderId={found.id} status={found.status} invoice={found.invoice} onIssued={() => void queryClient.invalidateQueries({ queryKey: deskKeys.orderDetail(found.id) })} />}
            />
          </>
        )}
      </PageQuery>
    </>
  );
}
