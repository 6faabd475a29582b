import { queryOptions, useQuery } from '@tanstack/react-query';
import { estimateListSchema } from '../../../../shared/schemas/estimate.schema';
import { apiClient } from '../../../lib/api-client';
import { estimateKeys } from './keys';

export function fetchProjectEstimates(projectId: number, signal?: AbortSignal) {
  return apiClient.get(`/api/projects/${projectId}/estimates`, { schema: estimateListSchema, signal });
}

export function projectEstimatesQueryOptions(projectId: number) {
  return queryOptions({
    queryKey: estimateKeys.list(projectId),
    queryFn: ({ signal }) => fetchProjectEstimates(projectId, signal),
    select: (body) => body.estimates,
  });
}

export function useProjectEstimates(projectId: number) {
  return useQuery(projectEstimatesQueryOptions(projectId));
}
