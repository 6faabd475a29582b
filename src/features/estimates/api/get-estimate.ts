import { queryOptions, useQuery } from '@tanstack/react-query';
import { estimateSchema } from '../../../../shared/schemas/estimate.schema';
import { apiClient } from '../../../lib/api-client';
import { estimateKeys } from './keys';

export function fetchEstimate(id: number, signal?: AbortSignal) {
  return apiClient.get(`/api/estimates/${id}`, { schema: estimateSchema, signal });
}

export function estimateQueryOptions(id: number) {
  return queryOptions({
    queryKey: estimateKeys.detail(id),
    queryFn: ({ signal }) => fetchEstimate(id, signal),
    // A saved estimate keeps its figures; a recompute is a new estimate.
    staleTime: Infinity,
  });
}

export function useEstimate(id: number) {
  return useQuery(estimateQueryOptions(id));
}
