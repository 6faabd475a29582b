import { PageHeader } from '../../components/ui/page-header';
import { QuoteRequestsList } from '../../features/quotes/components/quote-requests-list';
import { usePageTitle } from '../../lib/use-page-title';

export function QuotesRoute() {
  usePageTitle('Quotes');
  return (
    <>
      <PageHeader title="Quote requests" lead="Up to three merchants price the same estimate; compare the answers and accept one." />
      <QuoteRequestsList />
    </>
  );
}
