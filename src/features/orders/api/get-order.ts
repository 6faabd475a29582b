import { queryOptions, useQuery } from '@tanstack/react-query';
import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { orderKeys } from './keys';

export function fetchOrder(id: number, signal?: AbortSignal) {
  return apiClient.get(`/api/orders/${id}`, { schema: orderDetailSchema, signal });
}

export function orderQueryOptions(id: number) {
  return queryOptions({
    queryKey: orderKeys.detail(id),
    queryFn: ({ signal }) => fetchOrder(id, signal),
  });
}

export function useOrder(id: number) {
  return useQuery(orderQueryOptions(id));
}
