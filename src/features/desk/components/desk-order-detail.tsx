import { lazy, Suspense, useEffect, useMemo, useState } from 'react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { DELIVERY_METHOD_LABELS, ORDER_LINE_STATUS_LABELS } from '../../../../shared/schemas/order.schema';
import type { OrderDetail } from '../../../../shared/schemas/order.schema';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { Alert, ErrorAlert } from '../../../components/ui/alert';
import { OrderSiteDetails } from '../../../components/orders/order-site-details';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatCount, formatDate, formatDateTime, formatMoney, moneySign } from '../../../lib/format';
import { OrderAmounts } from '../../../components/orders/order-amounts';
import { useBranchStock } from '../api/get-branch-stock';
import { DeskStatusBadge } from './desk-status-badge';
import { FollowUpLinks } from './follow-up-links';
import { OrderComments } from './order-comments';
import { OrderTimeline } from '../../../components/orders/order-timeline';

// The desk's forms come after the order itself (the form library with them): their code is asked for
// as the page shows, alongside the branch's stock the answer forms wait for anyway.
const loadConfirmOrderForm = () => import('./confirm-order-form');
const loadOfferChangesForm = () => import('./offer-changes-form');
const loadTurnDownForm = () => import('./turn-down-form');
const loadFollowUpPanel = () => import('./follow-up-panel');
const loadSlotBooking = () => import('./slot-booking');
const ConfirmOrderForm = lazy(() => loadConfirmOrderForm().then((m) => ({ default: m.ConfirmOrderForm })));
const OfferChangesForm = lazy(() => loadOfferChangesForm().then((m) => ({ default: m.OfferChangesForm })));
const TurnDownForm = lazy(() => loadTurnDownForm().then((m) => ({ default: m.TurnDownForm })));
const FollowUpPanel = lazy(() => loadFollowUpPanel().then((m) => ({ default: m.FollowUpPanel })));
const SlotBooking = lazy(() => loadSlotBooking().then((m) => ({ default: m.SlotBooking })));

type DeskLine = OrderDetail['lines'][number] & { available: number | null; reorder_level: number | null };

const h = dataTableColumns<DeskLine>();
const lineColumns = h.columns([
  h.accessor('description', {
    header: 'Item',
    sortFn: 'text',
    cell: (info) => (
      <span className="block min-w-48">
        <span className="font-medium">{info.getValue()}</span>
        <span className="block font-mono text-xs text-ink-600">{info.row.original.sku}</span>
      </span>
    ),
  }),
  h.accessor('quantity', { header: 'Asked', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{formatCount(info.getValue())}</span> }),
  h.accessor((row) => row.available ?? -1, {
    id: 'available',
    header: 'Free at branch',
    sortFn: 'alphanumeric',
    cell: (info) => {
      const { available, reorder_level, quantity, confirmed_quantity } = info.row.original;
      if (available === null) return '—';
      const short = available < (confirmed_quantity ?? quantity);
      const low = reorder_level !== null && available <= reorder_level;
      return (
        <span className={`tabular-nums ${short ? 'font-semibold text-brick-700' : low ? 'text-ochre-800' : ''}`}>
          {formatCount(available)}
          {short ? ' (short)' : low ? ' (low)' : ''}
        </span>
      );
    },
  }),
  h.accessor('now_quantity', { header: 'This delivery', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{formatCount(info.getValue())}</span> }),
  h.accessor('back_order_quantity', { header: 'To follow', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue() ? formatCount(info.getValue()) : '—'}</span> }),
  h.accessor('dropped_quantity', { header: 'Dropped', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue() ? formatCount(info.getValue()) : '—'}</span> }),
  h.accessor('reserved_quantity', { header: 'Reserved', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue() ? formatCount(info.getValue()) : '—'}</span> }),
  h.accessor((row) => row.delivered_quantity ?? -1, {
    id: 'delivered',
    header: 'Delivered',
    sortFn: 'alphanumeric',
    cell: (info) => <span className="tabular-nums">{formatCount(info.row.original.delivered_quantity)}</span>,
  }),
  h.accessor('status', { header: 'State', sortFn: 'text', cell: (info) => <span className="whitespace-nowrap">{ORDER_LINE_STATUS_LABELS[info.getValue()]}</span> }),
  h.accessor('unit_price', { header: 'Pack price', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{formatMoney(info.getValue())}</span> }),
  h.accessor('now_total', { header: () => `This delivery (${moneySign()})`, sortFn: 'alphanumeric', cell: (info) => <span className="font-semibold tabular-nums">{formatMoney(info.getValue())}</span> }),
  h.accessor('to_follow_total', { header: () => `To follow (${moneySign()})`, sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue() ? formatMoney(info.getValue()) : '—'}</span> }),
]);

/** The booked delivery, as both sides see it. */
export function BookedSlot({ slot }: { slot: NonNullable<OrderDetail['slot']> }) {
  return (
    <dl className="grid grid-cols-[minmax(7rem,auto)_1fr] gap-x-6 gap-y-1" aria-label="Booked delivery">
      <dt className="text-sm text-ink-600">Day</dt>
      <dd className="font-semibold">
        {formatDate(slot.date)}, {slot.time_window}
      </dd>
      <dt className="text-sm text-ink-600">Lorry</dt>
      <dd>
        {slot.lorry.registration}
        {slot.lorry.has_crane ? ' (crane)' : ''}
      </dd>
      <dt className="text-sm text-ink-600">Driver</dt>
      <dd>{slot.driver?.name ?? 'not assigned yet'}</dd>
      <dt className="text-sm text-ink-600">Load</dt>
      <dd className="tabular-nums">
        {formatCount(Math.round(slot.weight_kg))} kg on {formatCount(slot.pallets)} pallets
      </dd>
    </dl>
  );
}

type Panel = 'confirm' | 'offer' | 'turn_down';

/**
 * One order as the desk answers it: stock per line, confirm or offer changes, the slot, comments and history.
 * `readOnly` is the yard's view of an order it loads: everything shown, nothing to answer, book or write.
 */
export function DeskOrderDetail({ order, invoiceAction, readOnly = false }: { order: OrderDetail; invoiceAction?: ReactNode; readOnly?: boolean }) {
  const stock = useBranchStock(order.branch.id);
  const stockByProduct = useMemo(() => new Map<number, StockItem>((stock.data?.items ?? []).map((s) => [s.product_id, s])), [stock.data]);
  const rows = useMemo<DeskLine[]>(
    () => order.lines.map((l) => ({ ...l, available: stockByProduct.get(l.product_id)?.available ?? null, reorder_level: stockByProduct.get(l.product_id)?.reorder_level ?? null })),
    [order.lines, stockByProduct],
  );
  const can = (action: string) => order.allowed_actions.includes(action);
  const panels: Panel[] = readOnly ? [] : [...(can('confirm') ? (['confirm'] as const) : []), ...(can('offer_changes') ? (['offer'] as const) : []), ...(can('turn_down') ? (['turn_down'] as const) : [])];
  const [panel, setPanel] = useState<Panel | null>(null);
  const shown = panel && panels.includes(panel) ? panel : (panels[0] ?? null);
  const openProposal = order.proposals.find((p) => p.status === 'open');
  const bookable = order.status === 'confirmed' && !readOnly;
  const firstPanel = panels[0];
  useEffect(() => {
    if (firstPanel === 'confirm') void loadConfirmOrderForm();
    else if (firstPanel === 'offer') void loadOfferChangesForm();
    else if (firstPanel === 'turn_down') void loadTurnDownForm();
  }, [firstPanel]);
  return (
    <div className="space-y-6">
      <Card>
        <div className="flex flex-wrap items-center justify-between gap-3">
          <DeskStatusBadge status={order.status} />
          <span className="text-sm text-ink-600">
            {order.contractor.name} · placed {formatDateTime(order.placed_at)} · revision {order.revision}
          </span>
        </div>
        <FollowUpLinks order={order} />
        {openProposal ? (
          <Alert tone="info" className="mt-4" title="Changes offered, waiting for the contractor" live={false}>
            Offered {formatDateTime(openProposal.proposed_at)}
            {openProposal.message ? `: ${openProposal.message}` : '.'}
          </Alert>
        ) : null}
        {invoiceAction ? <div className="mt-4 border-t border-mortar-200 pt-4">{invoiceAction}</div> : null}
      </Card>

      {panels.length > 0 ? (
        <Card title="Answer the order">
          <div className="mb-4 flex flex-wrap gap-2" role="group" aria-label="What to do">
            {panels.map((p) => (
              <Button key={p} variant={shown === p ? 'primary' : 'secondary'} aria-pressed={shown === p} onClick={() => setPanel(p)}>
                {p === 'confirm' ? 'Confirm all or part' : p === 'offer' ? 'Offer changes or a substitute' : 'Turn down'}
              </Button>
            ))}
          </div>
          {stock.isPending ? (
            <SkeletonBlock label="Loading the branch's stock" lines={3} />
          ) : stock.isError ? (
            <ErrorAlert error={stock.error} title="The branch's stock could not be loaded" onRetry={() => void stock.refetch()} />
          ) : (
            <Suspense fallback={<SkeletonBlock label="Loading the form" lines={3} />}>
              {shown === 'confirm' ? (
                <ConfirmOrderForm key={order.revision} order={order} stock={stockByProduct} />
              ) : shown === 'offer' ? (
                <OfferChangesForm key={order.revision} order={order} stock={stock.data.items} onDone={() => setPanel(null)} />
              ) : shown === 'turn_down' ? (
                <TurnDownForm orderId={order.id} reference={order.reference} />
              ) : null}
            </Suspense>
          )}
        </Card>
      ) : null}

      {can('start_follow_up') && !readOnly ? (
        <Suspense fallback={<SkeletonBlock label="Loading the follow-up" lines={2} />}>
          <FollowUpPanel key={order.id} order={order} />
        </Suspense>
      ) : null}

      <div className="grid items-start gap-6 lg:grid-cols-2">
        <Card title="Delivery">
          {order.slot ? <BookedSlot slot={order.slot} /> : <p className="mb-3 text-ink-700">No slot booked yet.</p>}
          {order.slot ? (
            <p className="mt-2">
              <Link to={`/yard/runs/${order.slot.slot_id}`} className="inline-flex min-h-tap items-center font-medium text-clay-700 underline underline-offset-2">
                Open the run
              </Link>
            </p>
          ) : null}
          <p className="mt-3 text-sm text-ink-700">
            Asked for {formatDate(order.requested_date)}
            {order.time_window ? `, ${order.time_window}` : ', any time'} · {DELIVERY_METHOD_LABELS[order.delivery_method]}
            {order.po_reference ? ` · PO ${order.po_reference}` : ''}
          </p>
          {order.notes ? <p className="mt-2 whitespace-pre-line text-sm">{order.notes}</p> : null}
          {order.delivery ? (
            <p className="mt-3 font-medium">
              Delivered {formatDateTime(order.delivery.delivered_at)}, taken by {order.delivery.received_by}
              {order.delivery.notes ? ` — ${order.delivery.notes}` : ''}
            </p>
          ) : null}
          {bookable ? (
            <div className="mt-4 border-t border-mortar-200 pt-4">
              <Suspense fallback={<SkeletonBlock label="Loading the delivery slots" lines={2} />}>
                <SlotBooking order={order} />
              </Suspense>
            </div>
          ) : null}
        </Card>
        <Card title="Site">
          <OrderSiteDetails site={order.site} />
        </Card>
      </div>

      <Card title="Lines">
        <DataTable caption="Lines of the order" captionHidden columns={lineColumns} data={rows} getRowId={(line) => String(line.id)} minWidthClass="min-w-[64rem]" />
        <OrderAmounts order={order} orderPath={(id) => `/desk/orders/${id}`} />
      </Card>

      <div className="grid items-start gap-6 lg:grid-cols-2">
        <Card title="Comments">
          <OrderComments orderId={order.id} comments={order.comments} readOnly={readOnly} />
        </Card>
        <Card title="History">
          <OrderTimeline events={order.timeline} />
        </Card>
      </div>
      {readOnly ? null : (
        <p>
          <Link to="/desk/orders" className="text-clay-700 underline underline-offset-2">
            Back to the order book
          </Link>
        </p>
      )}
    </div>
  );
}
