import { lazy, Suspense, useState } from 'react';
import { Link } from 'react-router-dom';
import { DELIVERY_METHOD_LABELS, ORDER_LINE_STATUS_LABELS } from '../../../../shared/schemas/order.schema';
import type { Order, OrderDetail as OrderDetailData, Proposal } from '../../../../shared/schemas/order.schema';
import { Alert } from '../../../components/ui/alert';
import { BackOrderLinks } from '../../../components/orders/back-order-links';
import { OrderSiteDetails } from '../../../components/orders/order-site-details';
import { Button, buttonClasses } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { formatDate, formatDateTime } from '../../../lib/format';
import { formatCount, formatMoney, moneySign } from '../../../lib/format';
import { OrderAmounts } from '../../../components/orders/order-amounts';
import { SubstituteFigures } from '../../../components/orders/substitute-figures';
import { OrderStages, OrderStatusBadge } from './order-status';
import { OrderTimeline } from '../../../components/orders/order-timeline';

const ProposalAnswerForm = lazy(() => import('./order-detail-forms').then((m) => ({ default: m.ProposalAnswerForm })));
const CancelOrderForm = lazy(() => import('./order-detail-forms').then((m) => ({ default: m.CancelOrderForm })));

const lineHelper = dataTableColumns<OrderDetailData['lines'][number]>();
const lineColumns = lineHelper.columns([
  lineHelper.accessor('description', {
    header: 'Item',
    sortFn: 'text',
    cell: (info) => (
      <span className="block min-w-52">
        <span className="font-medium">{info.getValue()}</span>
        <span className="block font-mono text-xs text-ink-600">{info.row.original.sku}</span>
      </span>
    ),
  }),
  lineHelper.accessor('quantity', {
    header: 'Asked',
    sortFn: 'alphanumeric',
    cell: (info) => (
      <span className="whitespace-nowrap tabular-nums">
        {formatCount(info.getValue())} {info.row.original.pack_size > 1 ? `× ${formatCount(info.row.original.pack_size)}` : ''}
      </span>
    ),
  }),
  lineHelper.accessor('now_quantity', { header: 'This delivery', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{formatCount(info.getValue())}</span> }),
  lineHelper.accessor('back_order_quantity', { header: 'To follow', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue() ? formatCount(info.getValue()) : '—'}</span> }),
  lineHelper.accessor('dropped_quantity', { header: 'Dropped', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue() ? formatCount(info.getValue()) : '—'}</span> }),
  lineHelper.accessor('status', { header: 'State', sortFn: 'text', cell: (info) => <span className="whitespace-nowrap">{ORDER_LINE_STATUS_LABELS[info.getValue()]}</span> }),
  lineHelper.accessor('unit_price', { header: 'Pack price', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{formatMoney(info.getValue())}</span> }),
  lineHelper.accessor('now_total', { header: () => `This delivery (${moneySign()})`, sortFn: 'alphanumeric', cell: (info) => <span className="font-semibold tabular-nums">{formatMoney(info.getValue())}</span> }),
  lineHelper.accessor('to_follow_total', {
    header: () => `To follow (${moneySign()})`,
    sortFn: 'alphanumeric',
    cell: (info) => <span className="tabular-nums">{info.getValue() ? formatMoney(info.getValue()) : '—'}</span>,
  }),
]);

function ProposalCard({ order, proposal }: { order: Order; proposal: Proposal }) {
  const open = proposal.status === 'open';
  const canAnswer = open && order.allowed_actions.includes('accept_changes');
  const changed = proposal.lines.filter((l) => l.confirmed_quantity !== l.quantity || l.back_order_quantity > 0 || l.substitute);
  return (
    <article className={`space-y-3 rounded-md border p-4 ${open ? 'border-ochre-500 bg-ochre-50' : 'border-mortar-300 bg-white'}`}>
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold">
          {open ? 'Changes offered by the merchant' : `Offer of ${formatDateTime(proposal.proposed_at)}`}
          <span className="ml-2 text-sm font-normal text-ink-600">
            {proposal.status === 'open' ? 'waiting for your answer' : proposal.status === 'accepted' ? 'accepted' : proposal.status === 'declined' ? 'declined' : 'lapsed (the order changed)'}
          </span>
        </h3>
        <span className="text-sm text-ink-600">
          {proposal.proposed_by?.name ?? 'The merchant'}, {formatDateTime(proposal.proposed_at)}
        </span>
      </header>
      {proposal.message ? <p className="whitespace-pre-line">{proposal.message}</p> : null}
      {proposal.proposed_date || proposal.proposed_time_window ? (
        <p>
          <span className="font-medium">Delivery offered:</span> {proposal.proposed_date ? formatDate(proposal.proposed_date) : formatDate(order.requested_date)}
          {proposal.proposed_time_window ? `, ${proposal.proposed_time_window}` : ''}
        </p>
      ) : null}
      {changed.length > 0 ? (
        <ul className="space-y-1">
          {changed.map((line) => (
            <li key={line.order_line_id}>
              <span className="font-medium">{line.description}</span>: {line.confirmed_quantity} of {line.quantity} packs now
              {line.back_order_quantity > 0 ? `, ${line.back_order_quantity} to follow` : ''}
              {line.substitute ? `; offered instead: ${line.substitute.quantity} × ${line.substitute.description} at ${formatMoney(line.substitute.unit_price)} (${formatMoney(line.substitute.total)})` : ''}
              {line.note ? ` — ${line.note}` : ''}
              {line.substitute?.figures ? (
                <div className="mt-2">
                  <p className="mb-2 text-sm">
                    {line.substitute.sku} replaces {line.sku} on the whole roof. The engine worked the order's roof out again with it; check the bill side by side before you accept.
                  </p>
                  <SubstituteFigures figures={line.substitute.figures} caption={`${line.sku} and ${line.substitute.sku} side by side`} />
                </div>
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
      {canAnswer ? (
        <Suspense fallback={<p className="text-sm text-ink-600">Loading the answer form…</p>}>
          <ProposalAnswerForm order={order} proposal={proposal} />
        </Suspense>
      ) : null}
    </article>
  );
}

function CancelOrder({ order }: { order: Order }) {
  const [confirming, setConfirming] = useState(false);
  if (!confirming) {
    return (
      <Button variant="ghost" onClick={() => setConfirming(true)}>
        Cancel the order
      </Button>
    );
  }
  return (
    <Suspense fallback={<p className="text-sm text-ink-600">Loading…</p>}>
      <CancelOrderForm order={order} onDone={() => setConfirming(false)} />
    </Suspense>
  );
}

/**
 * The back-ordered packs seen from the contractor's side: the linked orders, or a word that they will
 * follow when the merchant has not started them yet.
 */
function ContractorBackOrders({ order }: { order: Pick<OrderDetailData, 'status' | 'follows' | 'followed_by' | 'back_ordered_packs'> }) {
  // A cancelled or turned-down order sends nothing more, so nothing is promised to follow.
  const ended = order.status === 'cancelled' || order.status === 'turned_down';
  const waiting =
    order.back_ordered_packs > 0 && !order.followed_by && !ended
      ? `${order.back_ordered_packs} back-ordered ${order.back_ordered_packs === 1 ? 'pack follows' : 'packs follow'} as a separate order once the merchant has the stock; you will get an e-mail when it is started.`
      : undefined;
  return <BackOrderLinks order={order} orderPath={(id) => `/orders/${id}`} waiting={waiting} />;
}

/** One order as the contractor follows it: its stage, what was asked and agreed, the merchant's offers and the history. */
export function OrderDetail({ order }: { order: OrderDetailData }) {
  const openProposals = order.proposals.filter((p) => p.status === 'open');
  const pastProposals = order.proposals.filter((p) => p.status !== 'open');
  const canAmend = order.allowed_actions.includes('amend');
  const canCancel = order.allowed_actions.includes('cancel');
  return (
    <div className="space-y-6">
      <Card>
        <div className="flex flex-wrap items-center justify-between gap-3">
          <OrderStatusBadge status={order.status} />
          <span className="text-sm text-ink-600">
            Placed {formatDateTime(order.placed_at)} · revision {order.revision}
          </span>
        </div>
        <div className="mt-4">
          <OrderStages status={order.status} />
        </div>
        <ContractorBackOrders order={order} />
        {order.status === 'cancelled' ? (
          <Alert tone="info" className="mt-4" title="Cancelled" live={false}>
            {order.cancelled_at ? `Cancelled ${formatDateTime(order.cancelled_at)}.` : null}
          </Alert>
        ) : order.status === 'turned_down' ? (
          <Alert tone="danger" className="mt-4" title="The merchant cannot take this order" live={false}>
            See the history below for their reason; a quote request to other merchants may help.
          </Alert>
        ) : null}
        {canAmend || canCancel ? (
          <div className="mt-4 flex flex-wrap items-center gap-2 border-t border-mortar-200 pt-4">
            {canAmend ? (
              <Link to={`/orders/${order.id}/amend`} className={buttonClasses('secondary')}>
                Amend the order
              </Link>
            ) : null}
            {canCancel ? <CancelOrder order={order} /> : null}
            <p className="w-full text-sm text-ink-600">You can change or cancel the order until the merchant confirms it.</p>
          </div>
        ) : null}
      </Card>

      {openProposals.map((proposal) => (
        <ProposalCard key={proposal.id} order={order} proposal={proposal} />
      ))}

      <div className="grid items-start gap-6 lg:grid-cols-2">
        <Card title="Delivery">
          <dl className="grid grid-cols-[minmax(7rem,auto)_1fr] gap-x-6 gap-y-2">
            <dt className="text-sm text-ink-600">From</dt>
            <dd>
              {order.branch.merchant.name}, {order.branch.name} ({order.branch.town})
            </dd>
            <dt className="text-sm text-ink-600">Day wanted</dt>
            <dd className="font-semibold">
              {formatDate(order.requested_date)}
              {order.time_window ? `, ${order.time_window}` : ', any time'}
            </dd>
            <dt className="text-sm text-ink-600">Booked</dt>
            <dd data-testid="booked-slot">
              {order.slot ? (
                <>
                  <span className="font-semibold">
                    {formatDate(order.slot.date)}, {order.slot.time_window}
                  </span>
                  <span className="block text-sm">
                    Lorry {order.slot.lorry.registration}
                    {order.slot.lorry.has_crane ? ' with crane' : ''}
                    {order.slot.driver ? `, driver ${order.slot.driver.name}` : ''}
                  </span>
                </>
              ) : (
                'No delivery slot booked yet'
              )}
            </dd>
            {order.invoice ? (
              <>
                <dt className="text-sm text-ink-600">Invoice</dt>
                <dd>
                  <Link to={`/invoices/${order.invoice.id}`} className="font-semibold text-clay-700 underline underline-offset-2">
                    {order.invoice.number}: view and pay
                  </Link>
                </dd>
              </>
            ) : null}
            {order.delivery ? (
              <>
                <dt className="text-sm text-ink-600">Delivered</dt>
                <dd>
                  {formatDateTime(order.delivery.delivered_at)}, taken by {order.delivery.received_by}
                </dd>
              </>
            ) : null}
            <dt className="text-sm text-ink-600">Unloading</dt>
            <dd>{DELIVERY_METHOD_LABELS[order.delivery_method]}</dd>
            <dt className="text-sm text-ink-600">PO reference</dt>
            <dd>{order.po_reference || '—'}</dd>
            <dt className="text-sm text-ink-600">Notes</dt>
            <dd className="whitespace-pre-line">{order.notes || '—'}</dd>
          </dl>
        </Card>
        <Card title="Site, as sent">
          <OrderSiteDetails
            site={order.site}
            name={
              <Link to={`/sites/${order.project.id}`} className="font-medium text-clay-700 underline underline-offset-2">
                {order.site.name}
              </Link>
            }
          />
        </Card>
      </div>

      <Card title="Lines">
        <DataTable caption="Lines of the order" captionHidden columns={lineColumns} data={order.lines} getRowId={(line) => String(line.id)} minWidthClass="min-w-[48rem]" />
        <OrderAmounts order={order} orderPath={(id) => `/orders/${id}`} />
      </Card>

      {pastProposals.length > 0 ? (
        <Card title="Earlier offers">
          <div className="space-y-3">
            {pastProposals.map((proposal) => (
              <ProposalCard key={proposal.id} order={order} proposal={proposal} />
            ))}
          </div>
        </Card>
      ) : null}

      <Card title="History">
        <OrderTimeline events={order.timeline} />
      </Card>
    </div>
  );
}
