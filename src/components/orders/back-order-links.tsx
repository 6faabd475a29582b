import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { OrderDetail } from '../../../shared/schemas/order.schema';

const linkClasses = 'font-semibold text-clay-700 underline underline-offset-2';

/**
 * How an order and its back-ordered packs hang together, on either side's order page: the order
 * carrying them once the desk starts it, the order they came from, and (when given) a word about
 * packs still waiting. `orderPath` points the links at the viewer's own order pages.
 */
export function BackOrderLinks({
  order,
  orderPath,
  waiting,
  label = 'Back-ordered packs',
}: {
  order: Pick<OrderDetail, 'follows' | 'followed_by'>;
  orderPath: (id: number) => string;
  waiting?: ReactNode;
  label?: string;
}) {
  if (!order.follows && !order.followed_by && !waiting) return null;
  return (
    <ul className="mt-4 space-y-1" aria-label={label}>
      {order.followed_by ? (
        <li>
          The back-ordered packs follow as{' '}
          <Link to={orderPath(order.followed_by.id)} className={linkClasses}>
            {order.followed_by.reference}
          </Link>{' '}
          ({order.followed_by.status_label})
        </li>
      ) : null}
      {waiting ? <li>{waiting}</li> : null}
      {order.follows ? (
        <li>
          Carries the back-ordered packs of{' '}
          <Link to={orderPath(order.follows.id)} className={linkClasses}>
            {order.follows.reference}
          </Link>{' '}
          ({order.follows.status_label})
        </li>
      ) : null}
    </ul>
  );
}
