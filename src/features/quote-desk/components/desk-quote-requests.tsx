import { Link } from 'react-router-dom';
import type { z } from 'zod';
import { QUOTE_STATUS_LABELS } from '../../../../shared/schemas/order.schema';
import type { quoteRequestListSchema } from '../../../../shared/schemas/order.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDate, formatMoney } from '../../../lib/format';
import { useDeskQuoteRequests } from '../api/get-desk-quote-requests';

type Row = z.infer<typeof quoteRequestListSchema>['quote_requests'][number];

const helper = dataTableColumns<Row>();
const columns = helper.columns([
  helper.accessor('id', {
    header: 'Request',
    sortFn: 'alphanumeric',
    cell: (info) => (
      <Link to={`/desk/quotes/${info.getValue()}`} className="font-semibold whitespace-nowrap text-clay-700 underline underline-offset-2">
        Request {info.getValue()}
      </Link>
    ),
  }),
  helper.accessor((row) => row.contractor.name, { id: 'contractor', header: 'Contractor', sortFn: 'text' }),
  helper.accessor((row) => row.project.name, { id: 'site', header: 'Site', sortFn: 'text' }),
  helper.accessor('requested_date', { header: 'Wanted', sortFn: 'text', cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span> }),
  helper.display({
    id: 'answer',
    header: 'Your answer',
    cell: (info) => (
      <ul className="min-w-48 space-y-0.5 text-sm">
        {info.row.original.quotes.map((quote) => (
          <li key={quote.id}>
            {quote.branch.name}: {QUOTE_STATUS_LABELS[quote.status]}
            {quote.total !== null ? ` · ${formatMoney(quote.total)}` : ''}
          </li>
        ))}
      </ul>
    ),
  }),
  helper.accessor('created_at', { header: 'Asked', sortFn: 'text', cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span> }),
]);

/** Quote requests sent to the merchant's branches, newest first, with how each branch has answered. */
export function DeskQuoteRequests() {
  const requests = useDeskQuoteRequests();
  if (requests.isPending) return <SkeletonBlock label="Loading the quote requests" lines={4} />;
  if (requests.isError) return <ErrorAlert error={requests.error} title="The quote requests could not be loaded" onRetry={() => void requests.refetch()} />;
  return (
    <DataTable
      caption="Quote requests"
      captionHidden
      columns={columns}
      data={requests.data}
      getRowId={(row) => String(row.id)}
      initialSorting={[{ id: 'id', desc: true }]}
      minWidthClass="min-w-[52rem]"
      empty={<EmptyState title="No quote requests yet">When a contractor asks one of your branches to price an estimate, it shows here.</EmptyState>}
    />
  );
}
