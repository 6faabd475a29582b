import { ORDER_STATUS_LABELS } from '../../../../shared/schemas/order.schema';
import type { OrderStatus } from '../../../../shared/schemas/order.schema';

const CLASSES: Record<OrderStatus, string> = {
  sent: 'bg-ink-100 text-ink-800',
  changes_offered: 'bg-ochre-100 text-ochre-800',
  agreed: 'bg-ink-100 text-ink-800',
  confirmed: 'bg-moss-100 text-moss-800',
  on_the_road: 'bg-clay-100 text-clay-800',
  delivered: 'bg-moss-100 text-moss-800',
  cancelled: 'bg-brick-50 text-brick-800',
  turned_down: 'bg-brick-50 text-brick-800',
};

/** Orders that still need something from someone. */
export const OPEN_STATUSES: readonly OrderStatus[] = ['sent', 'changes_offered', 'agreed', 'confirmed', 'on_the_road'];

export function OrderStatusBadge({ status }: { status: OrderStatus }) {
  return <span className={`inline-block rounded px-2 py-0.5 text-sm font-semibold whitespace-nowrap ${CLASSES[status]}`}>{ORDER_STATUS_LABELS[status]}</span>;
}

const STEPS = ['Sent', 'Confirmed', 'On the road', 'Delivered'] as const;

function stepOf(status: OrderStatus): number {
  if (status === 'confirmed') return 1;
  if (status === 'on_the_road') return 2;
  if (status === 'delivered') return 3;
  return 0;
}

/** Where an order stands on its way from sent to delivered. */
export function OrderStages({ status }: { status: OrderStatus }) {
  const ended = status === 'cancelled' || status === 'turned_down';
  const at = stepOf(status);
  return (
    <ol className="grid grid-cols-4 gap-1" aria-label="Stages of the order">
      {STEPS.map((step, i) => {
        const done = !ended && (i < at || status === 'delivered');
        const current = !ended && i === at && status !== 'delivered';
        return (
          <li key={step} aria-current={current ? 'step' : undefined} className="space-y-1">
            <span className={`block h-2 rounded-full ${ended ? 'bg-ink-200' : done ? 'bg-moss-600' : current ? 'bg-clay-600' : 'bg-ink-200'}`} aria-hidden="true" />
            <span className={`block text-sm ${current ? 'font-semibold text-ink-900' : 'text-ink-600'}`}>
              {step}
              <span className="sr-only">{done ? ' (done)' : current ? ' (now)' : ended ? '' : ' (to come)'}</span>
            </span>
          </li>
        );
      })}
    </ol>
  );
}
