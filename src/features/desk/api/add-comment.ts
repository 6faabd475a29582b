import { useMutation, useQueryClient } from '@tanstack/react-query';
import { orderCommentSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { deskKeys } from './keys';

export function addComment(orderId: number, body: string) {
  return apiClient.post(`/api/orders/${orderId}/comments`, { body: { body }, schema: orderCommentSchema });
}

export function useAddComment(orderId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: string) => addComment(orderId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: deskKeys.orderDetail(orderId) }),
  });
}
