import { PageHeader } from '../../components/ui/page-header';
import { InvoicesList } from '../../features/invoices/components/invoices-list';
import { usePageTitle } from '../../lib/use-page-title';

export function InvoicesRoute() {
  usePageTitle('Invoices');
  return (
    <>
      <PageHeader title="Invoices" lead="Invoices issued from orders, what is paid and what is still owed." />
      <InvoicesList />
    </>
  );
}
