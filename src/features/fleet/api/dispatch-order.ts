import { useMutation, useQueryClient } from '@tanstack/react-query';
import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

/** The lorry has left: the order is on the road (409 not_booked / no_driver). */
export function dispatchOrder(orderId: number) {
  return apiClient.post(`/api/orders/${orderId}/dispatch`, { body: {}, schema: orderDetailSchema });
}

export function useDispatchOrder() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: dispatchOrder, onSuccess: () => queryClient.invalidateQueries({ queryKey: [...fleetKeys.all, 'slots'] }) });
}
