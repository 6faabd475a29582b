import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { useOrderMutation } from './use-order-mutation';

export function turnDownOrder(orderId: number, reason: string) {
  return apiClient.post(`/api/orders/${orderId}/turn-down`, { body: { reason }, schema: orderDetailSchema });
}

export function useTurnDownOrder(orderId: number) {
  return useOrderMutation(orderId, (reason: string) => turnDownOrder(orderId, reason));
}
