import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { orderListSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { orderKeys } from './keys';
import type { OrderFilters } from './keys';

export function fetchOrders(filters: OrderFilters, signal?: AbortSignal) {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value !== undefined && value !== '') params.set(key, String(value));
  const query = params.toString();
  return apiClient.get(`/api/orders${query ? `?${query}` : ''}`, { schema: orderListSchema, signal });
}

export function ordersQueryOptions(filters: OrderFilters = {}) {
  return queryOptions({
    queryKey: orderKeys.list(filters),
    queryFn: ({ signal }) => fetchOrders(filters, signal),
    placeholderData: keepPreviousData,
  });
}

export function useOrders(filters: OrderFilters = {}) {
  return useQuery(ordersQueryOptions(filters));
}
