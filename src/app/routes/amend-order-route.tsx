import { useMemo } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useToast } from '../../components/ui/toast';
import { useOrder } from '../../features/orders/api/get-order';
import { OrderForm } from '../../features/orders/components/order-form';
import type { OrderLineOption } from '../../features/orders/lib/order-form';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function AmendOrderRoute() {
  const orderId = idParam(useParams(), 'orderId');
  const order = useOrder(orderId);
  const navigate = useNavigate();
  const toast = useToast();
  usePageTitle('Amend the order');
  const lines = useMemo<OrderLineOption[]>(() => {
    const seen = new Set<number>();
    return (order.data?.lines ?? [])
      .filter((line) => (seen.has(line.product_id) ? false : (seen.add(line.product_id), true)))
      .map((line) => ({
        product_id: line.product_id,
        sku: line.sku,
        description: line.description,
        unit: line.unit,
        pack_size: line.pack_size,
        packs: line.quantity,
        unit_price: line.unit_price,
        excluded: line.status === 'replaced' || line.status === 'not_available',
      }));
  }, [order.data]);
  const target = useMemo(() => (order.data ? { mode: 'amend' as const, order_id: order.data.id, revision: order.data.revision } : null), [order.data]);
  return (
    <>
      <TextLink to={`/orders/${orderId}`}>← The order</TextLink>
      <PageQuery query={order} what="the order">
        {(found) => (
          <>
            <PageHeader title={`Amend ${found.reference}`} lead={`${found.branch.merchant.name}, ${found.branch.name}. The merchant sees the changes at once; an offer they made lapses.`} />
            {!found.allowed_actions.includes('amend') || !target ? (
              <Alert tone="info" live={false} title="This order can no longer be changed">
                The merchant has confirmed it, or it is closed. Ring the branch if something has to change.
              </Alert>
            ) : (
              <OrderForm
                target={target}
                branchName={found.branch.name}
                lines={lines}
                site={found.site}
                current={found}
                onDone={(saved) => {
                  toast.show(`${saved.reference} is changed and sent again.`, 'success');
                  navigate(`/orders/${saved.id}`);
                }}
              />
            )}
          </>
        )}
      </PageQuery>
    </>
  );
}
