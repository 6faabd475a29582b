import type { OrderEvent } from '../../../shared/schemas/order.schema';
import { formatDateTime } from '../../lib/format';

/** Every change to the order: who, when, what, oldest first. */
export function OrderTimeline({ events }: { events: readonly OrderEvent[] }) {
  return (
    <ol className="relative space-y-4 border-l-2 border-mortar-300 pl-5" aria-label="What happened, oldest first">
      {[...events]
        .sort((a, b) => a.at.localeCompare(b.at) || a.id - b.id)
        .map((event) => (
          <li key={event.id} className="relative">
            <span className="absolute top-1.5 -left-[1.72rem] h-3 w-3 rounded-full border-2 border-white bg-clay-600" aria-hidden="true" />
            <p className="font-medium">{event.summary}</p>
            <p className="text-sm text-ink-600">
              {formatDateTime(event.at)} · {event.actor.name}
              {event.actor.organisation ? `, ${event.actor.organisation.name}` : ''}
            </p>
          </li>
        ))}
    </ol>
  );
}
