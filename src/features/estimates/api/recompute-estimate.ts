import { useMutation, useQueryClient } from '@tanstack/react-query';
import { estimateSchema } from '../../../../shared/schemas/estimate.schema';
import { apiClient } from '../../../lib/api-client';
import { estimateKeys } from './keys';

/** The same schedule and system worked out again with today's engine and prices, saved as a new estimate. */
export function recomputeEstimate(id: number) {
  return apiClient.post(`/api/estimates/${id}/recompute`, { schema: estimateSchema });
}

export function useRecomputeEstimate() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recomputeEstimate,
    onSuccess: (estimate) => {
      queryClient.setQueryData(estimateKeys.detail(estimate.id), estimate);
      return queryClient.invalidateQueries({ queryKey: estimateKeys.lists() });
    },
  });
}
