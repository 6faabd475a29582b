import { PageHeader } from '../../components/ui/page-header';
import { AccountsTable } from '../../features/invoices/components/accounts-table';
import { usePageTitle } from '../../lib/use-page-title';

export function AccountsRoute() {
  usePageTitle('Accounts');
  return (
    <>
      <PageHeader title="Accounts" lead="Which contractors pay on account, and how many days they have from the invoice date; the rest pay by card." />
      <AccountsTable />
    </>
  );
}
