import { useNavigate, useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useToast } from '../../components/ui/toast';
import { useEstimate } from '../../features/estimates/api/get-estimate';
import { useProject } from '../../features/projects/api/get-project';
import { QuoteRequestForm } from '../../features/quotes/components/quote-request-form';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function QuoteRequestRoute() {
  const estimateId = idParam(useParams(), 'estimateId');
  const estimate = useEstimate(estimateId);
  const project = useProject(estimate.data?.project_id ?? 0);
  const navigate = useNavigate();
  const toast = useToast();
  usePageTitle('Ask for quotes');
  return (
    <>
      <TextLink to={`/estimates/${estimateId}`}>← Estimate {estimateId}</TextLink>
      <PageQuery query={estimate} what="the estimate">
        {(saved) => (
          <>
            <PageHeader title="Ask merchants for quotes" lead={`Estimate ${saved.id}: each merchant prices its own products for the quantities the estimate needs.`} />
            <QuoteRequestForm
              estimateId={saved.id}
              preferredBranchId={saved.system.branch?.id ?? null}
              craneAllowed={project.data?.crane_lift !== 'not_allowed'}
              onCreated={(request) => {
                toast.show(`Quote request ${request.id} sent to ${request.quotes.length} ${request.quotes.length === 1 ? 'branch' : 'branches'}.`, 'success');
                navigate(`/quotes/${request.id}`);
              }}
            />
          </>
        )}
      </PageQuery>
    </>
  );
}
