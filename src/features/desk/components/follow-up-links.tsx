import type { OrderDetail } from '../../../../shared/schemas/order.schema';
import { BackOrderLinks } from '../../../components/orders/back-order-links';

/** The linked orders on the desk's order page, pointing at the desk's own order pages. */
export function FollowUpLinks({ order }: { order: Pick<OrderDetail, 'follows' | 'followed_by'> }) {
  return <BackOrderLinks order={order} orderPath={(id) => `/desk/orders/${id}`} label="Linked orders" />;
}
