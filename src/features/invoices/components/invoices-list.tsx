import { lazy, Suspense, useState } from 'react';
import { Link } from 'react-router-dom';
import type { InvoiceStatus, InvoiceSummary } from '../../../../shared/schemas/invoice.schema';
import { SearchBarLoading } from '../../../components/form/search-bar-loading';
import { ErrorAlert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDate, formatMoney } from '../../../lib/format';
import { useInvoices } from '../api/get-invoices';

/** The filter bar (the form library with it) loads after the list's own code, while the invoices are asked for. */
const InvoiceFilters = lazy(() => import('./invoice-filters').then((m) => ({ default: m.InvoiceFilters })));

const h = dataTableColumns<InvoiceSummary>();
const columns = h.columns([
  h.accessor('number', {
    header: 'Invoice',
    enableSorting: false,
    cell: (info) => (
      <Link to={`/invoices/${info.row.original.id}`} className="font-semibold text-clay-700 underline underline-offset-2">
        {info.getValue()}
      </Link>
    ),
  }),
  h.accessor((r) => r.order.reference, { id: 'order', header: 'Order', enableSorting: false }),
  h.accessor((r) => r.contractor.name, { id: 'contractor', header: 'Contractor', enableSorting: false }),
  h.accessor((r) => r.branch.name, { id: 'branch', header: 'Branch', enableSorting: false }),
  h.accessor('issue_date', { header: 'Issued', enableSorting: false, cell: (info) => formatDate(info.getValue()) }),
  h.accessor('due_date', { header: 'Due', enableSorting: false, cell: (info) => (info.getValue() ? formatDate(info.getValue()!) : 'by card') }),
  h.accessor('status_label', {
    header: 'State',
    enableSorting: false,
    cell: (info) => (
      <span className={info.row.original.overdue ? 'font-semibold text-brick-700' : ''}>
        {info.getValue()}
        {info.row.original.overdue ? ' · overdue' : ''}
      </span>
    ),
  }),
  h.accessor('total', { header: 'Total', enableSorting: false, cell: (info) => <span className="tabular-nums">{formatMoney(info.getValue())}</span> }),
  h.accessor('balance', { header: 'Balance', enableSorting: false, cell: (info) => <span className="font-semibold tabular-nums">{formatMoney(info.getValue())}</span> }),
]);

export function InvoicesList() {
  const [status, setStatus] = useState<InvoiceStatus | undefined>(undefined);
  const [page, setPage] = useState(1);
  const invoices = useInvoices({ status, page });
  const pages = invoices.data ? Math.max(1, Math.ceil(invoices.data.total / invoices.data.page_size)) : 1;
  return (
    <section aria-label="Invoices" className="space-y-4">
      <Suspense fallback={<SearchBarLoading label="Loading the filter…" />}>
        <InvoiceFilters onStatus={setStatus} onPick={() => setPage(1)} />
      </Suspense>
      {invoices.isPending ? (
        <SkeletonBlock label="Loading the invoices" lines={5} />
      ) : invoices.isError ? (
        <ErrorAlert error={invoices.error} title="The invoices could not be loaded" onRetry={() => void invoices.refetch()} />
      ) : (
        <>
          <DataTable
            caption="Invoices"
            captionHidden
            columns={columns}
            data={invoices.data.invoices}
            getRowId={(r) => String(r.id)}
            minWidthClass="min-w-[60rem]"
            empty={<EmptyState title="No invoices">Invoices are issued from confirmed or delivered orders.</EmptyState>}
          />
          {pages > 1 ? (
            <div className="flex items-center gap-3">
              <Button variant="secondary" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
                Previous page
              </Button>
              <span className="text-sm">
                Page {page} of {pages}
              </span>
              <Button variant="secondary" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
                Next page
              </Button>
            </div>
          ) : null}
        </>
      )}
    </section>
  );
}
