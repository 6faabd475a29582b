import { Link } from 'react-router-dom';
import type { OrderDetail } from '../../../shared/schemas/order.schema';
import { formatCount, formatMoney } from '../../lib/format';

type Line = OrderDetail['lines'][number];

/**
 * The money of an order in the three parts both sides see alike: what comes on this delivery (the
 * invoice for it charges exactly this, before tax), what follows and on which order, and what was
 * dropped. Each part lists its lines with packs and price, so nothing is priced twice.
 */
export function OrderAmounts({ order, orderPath }: { order: Pick<OrderDetail, 'amounts' | 'lines' | 'followed_by' | 'status'>; orderPath: (id: number) => string }) {
  const following = order.lines.filter((l) => l.back_order_quantity > 0);
  const dropped = order.lines.filter((l) => l.dropped_quantity > 0);
  const part = (lines: Line[], packs: (l: Line) => number, total: (l: Line) => number) =>
    lines.length > 0 ? (
      <ul className="mt-1 space-y-0.5 text-sm text-ink-700">
        {lines.map((l) => (
          <li key={l.id}>
            {formatCount(packs(l))} × {l.description} at {formatMoney(l.unit_price)} = <span className="tabular-nums">{formatMoney(total(l))}</span>
          </li>
        ))}
      </ul>
    ) : null;
  return (
    <section aria-label="What the order comes to" className="mt-4 border-t border-mortar-200 pt-4">
      <dl className="space-y-3">
        {/* Each group is a dt with its dd amount and a dd for its detail: a dl may hold only such groups. */}
        <div className="flex flex-wrap items-baseline justify-between gap-x-2">
          <dt className="text-lg font-semibold">On this delivery</dt>
          <dd className="text-lg font-bold tabular-nums" data-testid="amount-now">
            {formatMoney(order.amounts.agreed_now_minor)}
          </dd>
          <dd className="basis-full text-sm text-ink-600">Before tax; the invoice for this delivery charges this amount.</dd>
        </div>
        {order.amounts.to_follow_minor > 0 ? (
          <div className="flex flex-wrap items-baseline justify-between gap-x-2">
            <dt className="font-semibold">
              To follow{' '}
              {order.followed_by ? (
                <>
                  on{' '}
                  <Link to={orderPath(order.followed_by.id)} className="text-clay-700 underline underline-offset-2">
                    {order.followed_by.reference}
                  </Link>
                </>
              ) : (
                'on a follow-up order, not started yet'
              )}
            </dt>
            <dd className="font-semibold tabular-nums" data-testid="amount-to-follow">
              {formatMoney(order.amounts.to_follow_minor)}
            </dd>
            <dd className="basis-full">
              {part(
                following,
                (l) => l.back_order_quantity,
                (l) => l.to_follow_total,
              )}
            </dd>
          </div>
        ) : null}
        {order.amounts.dropped_minor > 0 ? (
          <div className="flex flex-wrap items-baseline justify-between gap-x-2">
            <dt className="font-semibold">Dropped (not sent, not following)</dt>
            <dd className="font-semibold tabular-nums text-ink-700" data-testid="amount-dropped">
              {formatMoney(order.amounts.dropped_minor)}
            </dd>
            <dd className="basis-full">
              {part(
                dropped,
                (l) => l.dropped_quantity,
                (l) => l.dropped_total,
              )}
            </dd>
          </div>
        ) : null}
      </dl>
    </section>
  );
}
