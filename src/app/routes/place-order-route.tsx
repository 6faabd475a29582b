import { useMemo } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { EmptyState } from '../../components/ui/empty-state';
import { PageHeader } from '../../components/ui/page-header';
import { SkeletonBlock } from '../../components/ui/skeleton';
import { TextLink } from '../../components/ui/text-link';
import { useToast } from '../../components/ui/toast';
import { useEstimate } from '../../features/estimates/api/get-estimate';
import { OrderForm } from '../../features/orders/components/order-form';
import type { OrderLineOption } from '../../features/orders/lib/order-form';
import { useProject } from '../../features/projects/api/get-project';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function PlaceOrderRoute() {
  const estimateId = idParam(useParams(), 'estimateId');
  const estimate = useEstimate(estimateId);
  const project = useProject(estimate.data?.project_id ?? 0);
  const navigate = useNavigate();
  const toast = useToast();
  usePageTitle('Place an order');
  const lines = useMemo<OrderLineOption[]>(
    () =>
      (estimate.data?.lines ?? [])
        .filter((line) => line.product_id !== null)
        .map((line) => ({
          product_id: line.product_id!,
          sku: line.sku,
          description: line.description,
          unit: line.unit,
          pack_size: line.pack_size,
          packs: line.packs,
          unit_price: line.unit_price,
          needed: line.quantity,
        })),
    [estimate.data],
  );
  const target = useMemo(() => (estimate.data?.system.branch ? { mode: 'place' as const, estimate_id: estimate.data.id, branch_id: estimate.data.system.branch.id } : null), [estimate.data]);

  return (
    <>
      <TextLink to={`/estimates/${estimateId}`}>← Estimate {estimateId}</TextLink>
      <PageQuery query={estimate} what="the estimate">
        {(saved) =>
          !target || !saved.system.branch || lines.length === 0 ? (
            <EmptyState title="This estimate has no merchant’s products to order" action={<TextLink to={`/estimates/${saved.id}/quote`}>Ask merchants for quotes instead</TextLink>}>
              It was made with a generic system; merchants can price it from a quote request.
            </EmptyState>
          ) : (
            <>
              <PageHeader title={`Order from ${saved.system.branch.name}`} lead={`${saved.system.branch.merchant.name} · ${saved.system.name} · estimate ${saved.id}`} />
              {project.isPending ? (
                <SkeletonBlock label="Loading the site’s access details" lines={3} />
              ) : (
                <PageQuery query={project} what="the site">
                  {(site) => (
                    <OrderForm
                      target={target}
                      branchName={saved.system.branch!.name}
                      lines={lines}
                      site={site}
                      onDone={(order) => {
                        toast.show(`${order.reference} sent to ${order.branch.name}.`, 'success');
                        navigate(`/orders/${order.id}`);
                      }}
                    />
                  )}
                </PageQuery>
              )}
            </>
          )
        }
      </PageQuery>
    </>
  );
}
