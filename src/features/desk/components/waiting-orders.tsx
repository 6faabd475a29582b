import { Link } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { ErrorAlert } from '../../../components/ui/alert';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDate, formatMoney } from '../../../lib/format';
import { useOrderBook } from '../api/get-order-book';
import type { OrderBookFilters } from '../api/keys';

const WAITING: OrderBookFilters = { statuses: 'sent,agreed', sort: 'requested_date', dir: 'asc', page: 1, page_size: 10, date_field: 'requested_date' };

/** The desk's to-do on its home: orders waiting for an answer, the soonest wanted first. */
export function WaitingOrders() {
  const orders = useOrderBook(WAITING);
  return (
    <Card
      title="Waiting for the desk"
      actions={
        <Link to="/desk/orders?statuses=sent%2Cagreed&sort=requested_date&dir=asc" className="text-clay-700 underline underline-offset-2">
          Open the order book
        </Link>
      }
    >
      {orders.isPending ? (
        <SkeletonBlock label="Loading the waiting orders" lines={4} />
      ) : orders.isError ? (
        <ErrorAlert error={orders.error} title="The waiting orders could not be loaded" onRetry={() => void orders.refetch()} />
      ) : orders.data.orders.length === 0 ? (
        <p className="text-ink-600">Nothing waiting: every order has an answer.</p>
      ) : (
        <ul className="divide-y divide-mortar-200">
          {orders.data.orders.map((o) => (
            <li key={o.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
              <Link to={`/desk/orders/${o.id}`} className="font-semibold text-clay-700 underline underline-offset-2">
                {o.reference}
              </Link>
              <span className="flex-1 px-2">
                {o.contractor.name} · {o.project.name}
              </span>
              <span className="text-sm tabular-nums">
                wanted {formatDate(o.requested_date)} · {formatMoney(o.subtotal)}
              </span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
