import { queryOptions, useQuery } from '@tanstack/react-query';
import { palletViewSchema } from '../../../../shared/schemas/run.schema';
import { apiClient } from '../../../lib/api-client';
import { runKeys } from './keys';

/** One pallet of an order, as its label's QR code opens it. */
export function fetchPallet(orderId: number, pallet: number, signal?: AbortSignal) {
  return apiClient.get(`/api/orders/${orderId}/pallets/${pallet}`, { schema: palletViewSchema, signal });
}

export function palletQueryOptions(orderId: number, pallet: number) {
  return queryOptions({ queryKey: runKeys.pallet(orderId, pallet), queryFn: ({ signal }) => fetchPallet(orderId, pallet, signal) });
}

export function usePallet(orderId: number, pallet: number) {
  return useQuery(palletQueryOptions(orderId, pallet));
}
