import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import type { amendOrderBodySchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { orderKeys } from './keys';

export type AmendOrderValues = z.output<typeof amendOrderBodySchema>;

/** Changes what was asked for; the body names the revision it was made on, so a newer change is never overwritten. */
export function amendOrder(id: number, body: AmendOrderValues) {
  return apiClient.patch(`/api/orders/${id}`, { body, schema: orderDetailSchema });
}

export function useAmendOrder(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AmendOrderValues) => amendOrder(id, body),
    onSuccess: (order) => {
      queryClient.setQueryData(orderKeys.detail(order.id), order);
      return queryClient.invalidateQueries({ queryKey: orderKeys.lists() });
    },
  });
}
