import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { OrderDetail } from '../../../../shared/schemas/order.schema';
import { deskKeys } from './keys';

/**
 * Every desk action answers with the whole order as it now stands: it replaces the cached detail,
 * and the order book and the stock and slot figures it changed are fetched again.
 */
export function useOrderMutation<TInput>(orderId: number, send: (input: TInput) => Promise<OrderDetail>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: (order) => {
      queryClient.setQueryData(deskKeys.orderDetail(orderId), order);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: [...deskKeys.orders(), 'list'] }),
        queryClient.invalidateQueries({ queryKey: [...deskKeys.all, 'stock'] }),
        queryClient.invalidateQueries({ queryKey: [...deskKeys.all, 'slots'] }),
      ]);
    },
  });
}
