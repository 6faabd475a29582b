import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import type { ConfirmOrderBody } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { useOrderMutation } from './use-order-mutation';

/** Holds each line's packs from the branch's stock (the rest back-ordered); 409 insufficient_stock names the short SKUs. */
export function confirmOrder(orderId: number, body: ConfirmOrderBody) {
  return apiClient.post(`/api/orders/${orderId}/confirm`, { body, schema: orderDetailSchema });
}

export function useConfirmOrder(orderId: number) {
  return useOrderMutation(orderId, (body: ConfirmOrderBody) => confirmOrder(orderId, body));
}
