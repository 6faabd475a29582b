import { businessCalendar } from '../../../lib/business-calendar';
import { useMemo, useState } from 'react';
import { CATEGORY_LABELS } from '../../../../shared/schemas/catalogue.schema';
import { DELIVERY_METHOD_LABELS } from '../../../../shared/schemas/order.schema';
import type { Quote, QuoteRequest } from '../../../../shared/schemas/order.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { useToast } from '../../../components/ui/toast';
import { formatDate } from '../../../lib/format';
import { useAcceptQuote } from '../api/accept-quote';
import { useWithdrawQuoteRequest } from '../api/withdraw-quote-request';
import { formatMoney } from '../../../lib/format';
import { focusOnShow } from '../../../lib/focus-on-show';

type Comparison = NonNullable<QuoteRequest['comparison']>;
type Row = Comparison['rows'][number];

function QuoteHead({ quote, request, onAccepted }: { quote: Quote; request: QuoteRequest; onAccepted: (orderId: number) => void }) {
  const accept = useAcceptQuote();
  const toast = useToast();
  const [confirming, setConfirming] = useState(false);
  const totals = request.comparison?.totals.find((t) => t.quote_id === quote.id);
  const expired = quote.valid_until !== null && businessCalendar().isPast(quote.valid_until);
  const canAccept = request.status === 'open' && quote.status === 'answered' && !expired;
  return (
    <div className="space-y-2 rounded-md border border-mortar-300 bg-white p-4">
      <p className="font-semibold">{quote.branch.merchant.name}</p>
      <p className="text-sm text-ink-600">
        {quote.branch.name}, {quote.branch.town}
      </p>
      <p className="text-sm font-medium">{quote.status_label}</p>
      <p className="text-2xl font-bold tabular-nums">{formatMoney(quote.total)}</p>
      {totals ? (
        <p className="text-sm text-ink-700">
          {totals.lines_offered} lines priced{totals.lines_missing > 0 ? `, ${totals.lines_missing} not offered` : ''}
        </p>
      ) : null}
      {quote.valid_until ? <p className={`text-sm ${expired ? 'font-semibold text-brick-700' : 'text-ink-600'}`}>Valid until {formatDate(quote.valid_until)}</p> : null}
      {quote.message ? <p className="text-sm whitespace-pre-line">{quote.message}</p> : null}
      {canAccept ? (
        confirming ? (
          <div role="group" aria-label={`Accept the quote from ${quote.branch.name}?`} className="space-y-2">
            <p className="text-sm">This sends an order to {quote.branch.name} at these prices and closes the other quotes.</p>
            <div className="flex flex-wrap gap-2">
              <Button
                ref={focusOnShow}
                busy={accept.isPending}
                onClick={() =>
                  accept.mutate(quote.id, {
                    onSuccess: (answer) => {
                      toast.show(`Order ${answer.order.reference} sent to ${quote.branch.name}.`, 'success');
                      onAccepted(answer.order.id);
                    },
                    onError: (error) => {
                      setConfirming(false);
                      toast.show(errorMessage(error), 'danger');
                    },
                  })
                }
              >
                Yes, order from {quote.branch.name}
              </Button>
              <Button variant="secondary" onClick={() => setConfirming(false)}>
                Not yet
              </Button>
            </div>
          </div>
        ) : (
          <Button onClick={() => setConfirming(true)}>Accept this quote</Button>
        )
      ) : null}
    </div>
  );
}

function OfferCell({ offer }: { offer: Row['offers'][number] }) {
  if (!offer) return <span className="text-ink-500">Not offered</span>;
  return (
    <span className="block min-w-40 text-sm">
      <span className="block">{offer.description}</span>
      <span className="block tabular-nums text-ink-700">
        {offer.packs.toLocaleString('en-GB')} × {formatMoney(offer.unit_price)} = <span className="font-semibold">{formatMoney(offer.total)}</span>
      </span>
    </span>
  );
}

/** A quote request: what was asked, each merchant's answer side by side, and the one to accept. */
export function QuoteRequestDetail({ request, onAccepted }: { request: QuoteRequest; onAccepted: (orderId: number) => void }) {
  const withdraw = useWithdrawQuoteRequest();
  const toast = useToast();
  const comparison = request.comparison;
  const quotesInOrder = useMemo(() => (comparison ? comparison.quote_ids.map((id) => request.quotes.find((q) => q.id === id)).filter((q): q is Quote => Boolean(q)) : request.quotes), [comparison, request.quotes]);
  const columns = useMemo(() => {
    const helper = dataTableColumns<Row>();
    return helper.columns([
      helper.accessor('description', {
        header: 'Asked for',
        sortFn: 'text',
        cell: (info) => (
          <span className="block min-w-48">
            <span className="text-sm text-ink-600">{CATEGORY_LABELS[info.row.original.category]}</span>
            <span className="block font-medium">{info.getValue()}</span>
            <span className="block text-sm tabular-nums">
              {info.row.original.quantity.toLocaleString('en-GB')} {info.row.original.unit}
            </span>
          </span>
        ),
      }),
      ...quotesInOrder.map((quote, i) =>
        helper.display({
          id: `quote-${quote.id}`,
          header: `${quote.branch.merchant.name}, ${quote.branch.name}`,
          cell: (info) => <OfferCell offer={info.row.original.offers[i] ?? null} />,
        }),
      ),
    ]);
  }, [quotesInOrder]);

  return (
    <div className="space-y-6">
      <Card title="What was asked">
        <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-[auto_1fr]">
          <dt className="text-sm text-ink-600">Site</dt>
          <dd>{request.project.name}</dd>
          <dt className="text-sm text-ink-600">Day wanted</dt>
          <dd>
            {formatDate(request.requested_date)}
            {request.time_window ? `, ${request.time_window}` : ', any time'}
          </dd>
          <dt className="text-sm text-ink-600">Unloading</dt>
          <dd>{DELIVERY_METHOD_LABELS[request.delivery_method]}</dd>
          <dt className="text-sm text-ink-600">PO reference</dt>
          <dd>{request.po_reference || '—'}</dd>
        </dl>
        {request.status === 'open' ? (
          <div className="mt-4">
            <Button
              variant="ghost"
              busy={withdraw.isPending}
              onClick={() =>
                withdraw.mutate(request.id, {
                  onSuccess: () => toast.show('The request is withdrawn; the merchants are told.', 'success'),
                  onError: (error) => toast.show(errorMessage(error), 'danger'),
                })
              }
            >
              Withdraw the request
            </Button>
          </div>
        ) : (
          <Alert tone="info" className="mt-4" live={false}>
            {request.status === 'accepted' ? 'A quote was accepted and became an order.' : 'This request was withdrawn.'}
          </Alert>
        )}
      </Card>

      <div className={`grid gap-4 ${quotesInOrder.length >= 3 ? 'lg:grid-cols-3' : 'md:grid-cols-2'}`}>
        {quotesInOrder.map((quote) => (
          <QuoteHead key={quote.id} quote={quote} request={request} onAccepted={onAccepted} />
        ))}
      </div>

      {comparison ? <DataTable caption="The answers side by side" columns={columns} data={comparison.rows} getRowId={(row) => String(row.request_line_id)} minWidthClass="min-w-[52rem]" /> : null}
    </div>
  );
}
