import { useMutation, useQueryClient } from '@tanstack/react-query';
import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import type { FollowUpBody } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { deskKeys } from './keys';

/**
 * Starts a new order carrying an order's back-ordered packs; answers with the new order. Refused with
 * 409 follow_up_exists (details[0].reference names it), nothing_back_ordered or order_not_confirmed.
 */
export function startFollowUp(orderId: number, body: FollowUpBody) {
  return apiClient.post(`/api/orders/${orderId}/follow-up`, { body, schema: orderDetailSchema });
}

/**
 * The answer is the new order, not this one: it is cached under its own id (the page goes there
 * next), and this order is fetched again because it now names its follow-up.
 */
export function useStartFollowUp(orderId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: FollowUpBody) => startFollowUp(orderId, body),
    onSuccess: (followUp) => {
      queryClient.setQueryData(deskKeys.orderDetail(followUp.id), followUp);
      return Promise.all([queryClient.invalidateQueries({ queryKey: deskKeys.orderDetail(orderId) }), queryClient.invalidateQueries({ queryKey: [...deskKeys.orders(), 'list'] })]);
    },
  });
}
