import { ORDER_STATUS_LABELS } from '../../../../shared/schemas/order.schema';
import type { OrderStatus } from '../../../../shared/schemas/order.schema';

const tones: Record<OrderStatus, string> = {
  sent: 'border-ochre-500 bg-ochre-50 text-ochre-800',
  changes_offered: 'border-ink-400 bg-ink-50 text-ink-800',
  agreed: 'border-ochre-500 bg-ochre-50 text-ochre-800',
  confirmed: 'border-moss-600 bg-moss-50 text-moss-800',
  on_the_road: 'border-moss-600 bg-moss-50 text-moss-800',
  delivered: 'border-moss-600 bg-white text-moss-800',
  cancelled: 'border-mortar-300 bg-mortar-100 text-ink-700',
  turned_down: 'border-brick-600 bg-brick-50 text-brick-800',
};

/** The stage of an order, worded for the desk: "sent" is the one waiting for an answer. */
export function DeskStatusBadge({ status }: { status: OrderStatus }) {
  const label = status === 'sent' ? 'Waiting for the desk' : ORDER_STATUS_LABELS[status];
  return <span className={`inline-block rounded-full border px-2.5 py-0.5 text-sm font-medium whitespace-nowrap ${tones[status]}`}>{label}</span>;
}
