import { lazy, Suspense } from 'react';
import type { z } from 'zod';
import type { accountSchema } from '../../../../shared/schemas/invoice.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useAccounts } from '../api/get-accounts';

/** Each account's terms box (the form library with it) loads after the table shows. */
const AccountTermsForm = lazy(() => import('./account-terms-form').then((m) => ({ default: m.AccountTermsForm })));

type Account = z.infer<typeof accountSchema>;

const h = dataTableColumns<Account>();
const columns = h.columns([
  h.accessor((row) => row.contractor.name, { id: 'contractor', header: 'Contractor', sortFn: 'text' }),
  h.accessor('orders', { header: 'Orders', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
  h.accessor((row) => row.terms_days ?? -1, {
    id: 'terms',
    header: 'Pays',
    sortFn: 'alphanumeric',
    cell: (info) => (info.row.original.terms_days === null ? 'By card' : `On account, ${info.row.original.terms_days} days`),
  }),
  h.display({
    id: 'change',
    header: 'Terms (0 to 120 days)',
    cell: (info) => (
      <Suspense fallback={<span className="text-sm text-ink-600">Loading…</span>}>
        <AccountTermsForm key={`${info.row.original.contractor.id}-${info.row.original.terms_days}`} account={info.row.original} />
      </Suspense>
    ),
  }),
]);

/** The merchant's contractors and their payment terms: on account with days to pay, or by card. */
export function AccountsTable() {
  const accounts = useAccounts();
  if (accounts.isPending) return <SkeletonBlock label="Loading the accounts" lines={4} />;
  if (accounts.isError) return <ErrorAlert error={accounts.error} title="The accounts could not be loaded" onRetry={() => void accounts.refetch()} />;
  return (
    <DataTable
      caption="Contractor accounts"
      captionHidden
      columns={columns}
      data={accounts.data}
      getRowId={(row) => String(row.contractor.id)}
      initialSorting={[{ id: 'contractor', desc: false }]}
      minWidthClass="min-w-[48rem]"
      empty={<EmptyState title="No contractors yet">A contractor shows here once it orders from one of your branches.</EmptyState>}
    />
  );
}
