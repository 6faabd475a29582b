import { queryOptions, useQuery } from '@tanstack/react-query';
import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { deskKeys } from './keys';

export function fetchDeskOrder(id: number, signal?: AbortSignal) {
  return apiClient.get(`/api/orders/${id}`, { schema: orderDetailSchema, signal });
}

export function deskOrderQueryOptions(id: number) {
  return queryOptions({ queryKey: deskKeys.orderDetail(id), queryFn: ({ signal }) => fetchDeskOrder(id, signal) });
}

export function useDeskOrder(id: number) {
  return useQuery(deskOrderQueryOptions(id));
}
