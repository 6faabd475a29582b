import { useMutation, useQueryClient } from '@tanstack/react-query';
import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { orderKeys } from './keys';

export function cancelOrder(id: number, reason?: string) {
  return apiClient.post(`/api/orders/${id}/cancel`, { body: reason ? { reason } : {}, schema: orderDetailSchema });
}

export function useCancelOrder(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (reason?: string) => cancelOrder(id, reason),
    onSuccess: (order) => {
      queryClient.setQueryData(orderKeys.detail(order.id), order);
      return queryClient.invalidateQueries({ queryKey: orderKeys.lists() });
    },
  });
}
