import type { Quote, QuoteRequest } from '../../../../shared/schemas/order.schema';
import { Alert, ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDate, formatMoney } from '../../../lib/format';
import { useQuoteBranchStock } from '../api/get-quote-branch-stock';
import { AnswerQuoteForm } from './answer-quote-form';
import { DeclineQuoteForm } from './decline-quote-form';

function QuoteAnswer({ request, quote }: { request: QuoteRequest; quote: Quote }) {
  const stock = useQuoteBranchStock(quote.branch.id);
  const open = request.status === 'open' && (quote.status === 'asked' || quote.status === 'answered');
  return (
    <Card title={`${quote.branch.name}: ${quote.status_label}`}>
      {quote.total !== null ? (
        <p className="mb-3">
          Quoted total <strong className="tabular-nums">{formatMoney(quote.total)}</strong>
          {quote.valid_until ? `, prices hold until ${formatDate(quote.valid_until)}` : ''}.
        </p>
      ) : null}
      {!open ? (
        <p className="text-ink-600">This quote is closed; nothing more to answer.</p>
      ) : stock.isPending ? (
        <SkeletonBlock label="Loading the branch's products" lines={4} />
      ) : stock.isError ? (
        <ErrorAlert error={stock.error} title="The branch's products could not be loaded" onRetry={() => void stock.refetch()} />
      ) : (
        <div className="space-y-8">
          <AnswerQuoteForm key={quote.answered_at ?? 'unanswered'} request={request} quote={quote} stock={stock.data} />
          <details className="rounded-md border border-mortar-300 p-3">
            <summary className="cursor-pointer font-medium">The branch cannot quote</summary>
            <div className="mt-3">
              <DeclineQuoteForm quoteId={quote.id} />
            </div>
          </details>
        </div>
      )}
    </Card>
  );
}

/** One quote request as the desk sees it: what is asked for, where and when, and the branch's answer. */
export function DeskQuoteDetail({ request }: { request: QuoteRequest }) {
  return (
    <div className="space-y-6">
      <Card title="What is asked for">
        <dl className="grid gap-2 sm:grid-cols-2">
          <div>
            <dt className="text-sm text-ink-600">Wanted</dt>
            <dd>
              {formatDate(request.requested_date)}
              {request.time_window ? `, ${request.time_window}` : ''} · {request.delivery_method === 'roof' ? 'to the roof (crane)' : 'to the ground'}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-600">Site</dt>
            <dd>
              {request.site.name}, {request.site.site_address}
            </dd>
          </div>
          {request.notes ? (
            <div className="sm:col-span-2">
              <dt className="text-sm text-ink-600">Notes</dt>
              <dd>{request.notes}</dd>
            </div>
          ) : null}
        </dl>
      </Card>
      {request.cautions.length ? (
        <Alert tone="caution" title="Before you price this">
          <ul className="list-disc pl-5">
            {request.cautions.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </Alert>
      ) : null}
      {request.quotes.map((quote) => (
        <QuoteAnswer key={quote.id} request={request} quote={quote} />
      ))}
    </div>
  );
}
