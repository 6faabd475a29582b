import { useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useDeskQuoteRequest } from '../../features/quote-desk/api/get-desk-quote-request';
import { DeskQuoteDetail } from '../../features/quote-desk/components/desk-quote-detail';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function DeskQuoteRoute() {
  const requestId = idParam(useParams(), 'requestId');
  const request = useDeskQuoteRequest(requestId);
  usePageTitle(`Quote request ${requestId}`);
  return (
    <>
      <TextLink to="/desk/quotes">← Quote requests</TextLink>
      <PageQuery query={request} what="the quote request">
        {(found) => (
          <>
            <PageHeader title={`Quote request ${found.id}`} lead={`${found.contractor.name} · ${found.project.name}`} />
            <DeskQuoteDetail request={found} />
          </>
        )}
      </PageQuery>
    </>
  );
}
