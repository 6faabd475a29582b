import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { useOrderMutation } from './use-order-mutation';

/** 409 slot_full (with the lorry's remaining kg and pallets), crane_needed or crane_too_small when the lorry cannot take it. */
export function bookSlot(orderId: number, slotId: number) {
  return apiClient.put(`/api/orders/${orderId}/slot`, { body: { slot_id: slotId }, schema: orderDetailSchema });
}

export function useBookSlot(orderId: number) {
  return useOrderMutation(orderId, (slotId: number) => bookSlot(orderId, slotId));
}
