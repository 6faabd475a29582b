import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { orderListSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { LIVE_BOARD } from '../../../lib/live-board';
import { deskKeys } from './keys';
import type { OrderBookFilters } from './keys';

export function fetchOrderBook(filters: OrderBookFilters, signal?: AbortSignal) {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value !== undefined && value !== '') params.set(key, String(value));
  const query = params.toString();
  return apiClient.get(`/api/orders${query ? `?${query}` : ''}`, { schema: orderListSchema, signal });
}

export function orderBookQueryOptions(filters: OrderBookFilters) {
  return queryOptions({
    queryKey: deskKeys.orderList(filters),
    queryFn: ({ signal }) => fetchOrderBook(filters, signal),
    // The page stays on screen while the next page or filter loads.
    placeholderData: keepPreviousData,
    ...LIVE_BOARD,
  });
}

export function useOrderBook(filters: OrderBookFilters) {
  return useQuery(orderBookQueryOptions(filters));
}
