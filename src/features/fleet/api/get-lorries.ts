import { queryOptions, useQuery } from '@tanstack/react-query';
import { lorryListSchema } from '../../../../shared/schemas/fleet.schema';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

export function fetchLorries(branchId: number, signal?: AbortSignal) {
  return apiClient.get(`/api/branches/${branchId}/lorries`, { schema: lorryListSchema, signal });
}

export function useLorries(branchId: number) {
  return useQuery(queryOptions({ queryKey: fleetKeys.lorries(branchId), queryFn: ({ signal }) => fetchLorries(branchId, signal) }));
}
