import { queryOptions, useQuery } from '@tanstack/react-query';
import { substituteOptionsSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { deskKeys } from './keys';

/** What the desk may offer instead of one line: quantities, and for a tile the engine's figures for the order's roof. */
export function fetchSubstitutes(orderId: number, lineId: number, signal?: AbortSignal) {
  return apiClient.get(`/api/orders/${orderId}/lines/${lineId}/substitutes`, { schema: substituteOptionsSchema, signal });
}

export function substitutesQueryOptions(orderId: number, lineId: number, revision: number) {
  return queryOptions({ queryKey: deskKeys.substitutes(orderId, lineId, revision), queryFn: ({ signal }) => fetchSubstitutes(orderId, lineId, signal), staleTime: 60_000 });
}

export function useSubstitutes(orderId: number, lineId: number, revision: number, enabled: boolean) {
  return useQuery({ ...substitutesQueryOptions(orderId, lineId, revision), enabled });
}
