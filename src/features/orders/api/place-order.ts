import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import type { placeOrderBodySchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { orderKeys } from './keys';

export type PlaceOrderValues = z.output<typeof placeOrderBodySchema>;

export function placeOrder(body: PlaceOrderValues) {
  return apiClient.post('/api/orders', { body, schema: orderDetailSchema });
}

export function usePlaceOrder() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: placeOrder,
    onSuccess: (order) => {
      queryClient.setQueryData(orderKeys.detail(order.id), order);
      return queryClient.invalidateQueries({ queryKey: orderKeys.lists() });
    },
  });
}
