import { queryOptions, useQuery } from '@tanstack/react-query';
import { estimateComparisonSchema } from '../../../../shared/schemas/estimate.schema';
import { apiClient } from '../../../lib/api-client';
import { estimateKeys } from './keys';

export function fetchComparison(a: number, b: number, signal?: AbortSignal) {
  return apiClient.get(`/api/estimates/compare?a=${a}&b=${b}`, { schema: estimateComparisonSchema, signal });
}

export function comparisonQueryOptions(a: number, b: number) {
  return queryOptions({
    queryKey: estimateKeys.comparison(a, b),
    queryFn: ({ signal }) => fetchComparison(a, b, signal),
    staleTime: Infinity,
  });
}

export function useComparison(a: number, b: number, enabled = true) {
  return useQuery({ ...comparisonQueryOptions(a, b), enabled });
}
