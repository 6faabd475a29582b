import { lazy, Suspense } from 'react';
import type { OrderComment } from '../../../../shared/schemas/order.schema';
import { formatDateTime } from '../../../lib/format';

const OrderCommentForm = lazy(() => import('./order-comment-form').then((m) => ({ default: m.OrderCommentForm })));

/** Comments between the desk and the contractor, oldest first; the other side's are set apart. `readOnly`: no form. */
export function OrderComments({ orderId, comments, readOnly = false }: { orderId: number; comments: readonly OrderComment[]; readOnly?: boolean }) {
  return (
    <div className="space-y-4">
      {comments.length === 0 ? (
        <p className="text-ink-600">No comments yet.</p>
      ) : (
        <ol className="space-y-3" aria-label="Comments, oldest first">
          {comments.map((c) => (
            <li key={c.id} className={`rounded-md border px-3 py-2 ${c.side === 'merchant' ? 'border-mortar-300 bg-white' : 'ml-6 border-ochre-500 bg-ochre-50'}`}>
              <p className="whitespace-pre-line">{c.body}</p>
              <p className="mt-1 text-sm text-ink-600">
                {c.author.name}, {c.author.organisation.name} · {formatDateTime(c.at)}
              </p>
            </li>
          ))}
        </ol>
      )}
      {readOnly ? null : (
        <Suspense fallback={<p className="text-sm text-ink-600">Loading the comment box…</p>}>
          <OrderCommentForm orderId={orderId} />
        </Suspense>
      )}
    </div>
  );
}
