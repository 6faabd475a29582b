import { lazy, Suspense } from 'react';
import { CREDIT_REASON_LABELS, PAY_BY_LABELS } from '../../../../shared/schemas/invoice.schema';
import type { Invoice } from '../../../../shared/schemas/invoice.schema';
import { Link } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { buttonClasses } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { formatCount, formatDate, formatDateTime, formatMoney } from '../../../lib/format';
import { invoicePrintUrl, invoiceXlsxUrl } from '../api/keys';
import { PayByCard } from './pay-by-card';
import type { PaymentReturn } from './pay-by-card';

/** Crediting an invoice (the desk, at the foot of the page): its form and the form library load when it shows. */
const CreditNoteForm = lazy(() => import('./credit-note-form').then((m) => ({ default: m.CreditNoteForm })));

type Line = Invoice['lines'][number];
const h = dataTableColumns<Line>();
const columns = h.columns([
  h.accessor('description', {
    header: 'Item',
    sortFn: 'text',
    cell: (info) => (
      <span className="block min-w-44">
        {info.getValue()}
        <span className="block font-mono text-xs text-ink-600">{info.row.original.sku}</span>
      </span>
    ),
  }),
  h.accessor('quantity', { header: 'Packs', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{formatCount(info.getValue())}</span> }),
  h.accessor('unit_price', { header: 'Pack price', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{formatMoney(info.getValue())}</span> }),
  h.accessor('net', { header: 'Net', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{formatMoney(info.getValue())}</span> }),
  h.accessor('tax_rate_bp', { header: 'Tax rate', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{(info.getValue() / 100).toLocaleString('en-GB')} %</span> }),
  h.accessor('tax', { header: 'Tax', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{formatMoney(info.getValue())}</span> }),
  h.accessor('total', { header: 'Total', sortFn: 'alphanumeric', cell: (info) => <span className="font-semibold tabular-nums">{formatMoney(info.getValue())}</span> }),
  h.accessor('credited_quantity', { header: 'Credited', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue() ? formatCount(info.getValue()) : '—'}</span> }),
]);

interface InvoiceDetailProps {
  invoice: Invoice;
  /** The merchant's desk may credit; the contractor may pay. */
  canCredit: boolean;
  canPay: boolean;
  returned: PaymentReturn;
  /** Where the order behind the invoice is, on this side. */
  orderPath: string;
}

export function InvoiceDetail({ invoice, canCredit, canPay, returned, orderPath }: InvoiceDetailProps) {
  return (
    <div className="space-y-6">
      <Card>
        <div className="flex flex-wrap items-center justify-between gap-3">
          <span className="rounded-full border border-mortar-300 px-3 py-0.5 font-medium" data-testid="invoice-status">
            {invoice.status_label}
          </span>
          <div className="flex flex-wrap gap-2">
            <a href={invoicePrintUrl(invoice.id)} target="_blank" rel="noreferrer" className={buttonClasses('secondary')}>
              Printable invoice
            </a>
            <a href={invoiceXlsxUrl(invoice.id)} download className={buttonClasses('secondary')}>
              Download .xlsx
            </a>
          </div>
        </div>
        <dl className="mt-4 grid grid-cols-[minmax(8rem,auto)_1fr] gap-x-6 gap-y-1">
          <dt className="text-sm text-ink-600">Order</dt>
          <dd>
            <Link to={orderPath} className="text-clay-700 underline underline-offset-2">
              {invoice.order.reference}
            </Link>
            {invoice.po_reference ? ` · PO ${invoice.po_reference}` : ''} · {invoice.site_name}
          </dd>
          <dt className="text-sm text-ink-600">Between</dt>
          <dd>
            {invoice.branch.name} and {invoice.contractor.name}
          </dd>
          <dt className="text-sm text-ink-600">Issued</dt>
          <dd>
            {formatDate(invoice.issue_date)} ({invoice.basis === 'delivered' ? 'packs delivered' : 'packs confirmed'})
          </dd>
          <dt className="text-sm text-ink-600">Payment</dt>
          <dd>
            {PAY_BY_LABELS[invoice.pay_by]}
            {invoice.due_date ? `, due ${formatDate(invoice.due_date)}` : ''}
            {invoice.overdue ? <span className="ml-2 font-semibold text-brick-700">overdue</span> : null}
          </dd>
        </dl>
      </Card>

      <Card title="Lines">
        <DataTable caption="Invoice lines" captionHidden columns={columns} data={invoice.lines} getRowId={(l) => String(l.id)} minWidthClass="min-w-[52rem]" />
        <dl className="mt-4 ml-auto grid max-w-sm grid-cols-2 gap-y-1 text-right tabular-nums" aria-label="Totals">
          <dt>Net</dt>
          <dd>{formatMoney(invoice.subtotal)}</dd>
          <dt>Tax</dt>
          <dd>{formatMoney(invoice.tax_total)}</dd>
          <dt className="font-semibold">Total</dt>
          <dd className="font-semibold">{formatMoney(invoice.total)}</dd>
          <dt>Credited</dt>
          <dd>{formatMoney(invoice.credited)}</dd>
          <dt>Paid</dt>
          <dd>{formatMoney(invoice.paid)}</dd>
          <dt className="text-lg font-bold">Balance</dt>
          <dd className="text-lg font-bold" data-testid="invoice-balance">
            {formatMoney(invoice.balance)}
          </dd>
        </dl>
      </Card>

      {canPay && invoice.card_payment ? (
        <Card title="Pay">
          {invoice.pay_by === 'account' && invoice.balance > 0 ? (
            <p className="mb-3 text-ink-700">This invoice is on your account: pay by the due date{invoice.due_date ? ` (${formatDate(invoice.due_date)})` : ''} as usual, or by card now if you prefer.</p>
          ) : null}
          <PayByCard invoice={invoice} returned={returned} />
        </Card>
      ) : canPay && invoice.balance > 0 ? (
        <Alert tone="info" title="On account" live={false}>
          Pay by the due date on your account terms{invoice.due_date ? ` (${formatDate(invoice.due_date)})` : ''}.
        </Alert>
      ) : null}

      {invoice.payments.length > 0 ? (
        <Card title="Payments">
          <ul className="space-y-1">
            {invoice.payments.map((p) => (
              <li key={p.id}>
                {formatMoney(p.amount)} by card · {p.status === 'succeeded' ? `paid ${p.paid_at ? formatDateTime(p.paid_at) : ''}` : p.status === 'open' ? 'waiting for the card' : 'failed'}
                {p.last_error ? ` · ${p.last_error}` : ''}
              </li>
            ))}
          </ul>
        </Card>
      ) : null}

      <Card title="Credit notes">
        {invoice.credit_notes.length === 0 ? (
          <p className="text-ink-600">None.</p>
        ) : (
          <ul className="space-y-2">
            {invoice.credit_notes.map((cn) => (
              <li key={cn.id}>
                <span className="font-semibold">{cn.number}</span> · {CREDIT_REASON_LABELS[cn.reason]} · {formatMoney(cn.total)} · {formatDate(cn.created_at)}
                {cn.refund ? ` · refund ${formatMoney(cn.refund.amount)} ${cn.refund.status}` : ''}
                {cn.notes ? <span className="block text-sm text-ink-600">{cn.notes}</span> : null}
              </li>
            ))}
          </ul>
        )}
        {canCredit && invoice.status !== 'credited' ? (
          <div className="mt-4 border-t border-mortar-200 pt-4">
            <Suspense fallback={<p className="text-sm text-ink-600">Loading the credit note form…</p>}>
              <CreditNoteForm invoice={invoice} />
            </Suspense>
          </div>
        ) : null}
      </Card>
    </div>
  );
}
