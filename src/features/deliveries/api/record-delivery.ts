import { useMutation, useQueryClient } from '@tanstack/react-query';
import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import type { RecordDeliveryBody } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { deliveryKeys } from './keys';

export function recordDelivery(orderId: number, body: RecordDeliveryBody) {
  return apiClient.post(`/api/orders/${orderId}/delivery`, { body, schema: orderDetailSchema });
}

export function useRecordDelivery(orderId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: RecordDeliveryBody) => recordDelivery(orderId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: deliveryKeys.all }),
  });
}
