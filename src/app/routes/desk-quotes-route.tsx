import { PageHeader } from '../../components/ui/page-header';
import { DeskQuoteRequests } from '../../features/quote-desk/components/desk-quote-requests';
import { usePageTitle } from '../../lib/use-page-title';

export function DeskQuotesRoute() {
  usePageTitle('Quote requests');
  return (
    <>
      <PageHeader title="Quote requests" lead="Contractors asking your branches to price an estimate: answer with your products and prices, or decline." />
      <DeskQuoteRequests />
    </>
  );
}
