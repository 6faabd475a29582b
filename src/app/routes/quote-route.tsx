import { useQueryClient } from '@tanstack/react-query';
import { useNavigate, useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { orderKeys } from '../../features/orders/api/keys';
import { useQuoteRequest } from '../../features/quotes/api/get-quote-request';
import { QuoteRequestDetail } from '../../features/quotes/components/quote-request-detail';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function QuoteRoute() {
  const requestId = idParam(useParams(), 'requestId');
  const request = useQuoteRequest(requestId);
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  usePageTitle(`Quote request ${requestId}`);
  return (
    <>
      <TextLink to="/quotes">← Quote requests</TextLink>
      <PageQuery query={request} what="the quote request">
        {(found) => (
          <>
            <PageHeader title={`Quote request ${found.id}`} lead={`${found.project.name} · estimate ${found.estimate_id}`} />
            <QuoteRequestDetail
              request={found}
              onAccepted={(orderId) => {
                void queryClient.invalidateQueries({ queryKey: orderKeys.all });
                navigate(`/orders/${orderId}`);
              }}
            />
          </>
        )}
      </PageQuery>
    </>
  );
}
