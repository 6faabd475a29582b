import { useMutation, useQueryClient } from '@tanstack/react-query';
import { estimateSchema } from '../../../../shared/schemas/estimate.schema';
import type { CreateEstimateBody } from '../../../../shared/schemas/estimate.schema';
import { apiClient } from '../../../lib/api-client';
import { estimateKeys } from './keys';

export function createEstimate(projectId: number, body: CreateEstimateBody) {
  return apiClient.post(`/api/projects/${projectId}/estimates`, { body, schema: estimateSchema });
}

export function useCreateEstimate(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateEstimateBody) => createEstimate(projectId, body),
    onSuccess: (estimate) => {
      queryClient.setQueryData(estimateKeys.detail(estimate.id), estimate);
      return queryClient.invalidateQueries({ queryKey: estimateKeys.lists() });
    },
  });
}
