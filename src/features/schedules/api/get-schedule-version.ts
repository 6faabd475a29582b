import { queryOptions, useQuery } from '@tanstack/react-query';
import { scheduleResponseSchema } from '../../../../shared/schemas/schedule-upload.schema';
import { apiClient } from '../../../lib/api-client';
import { scheduleKeys } from './keys';

export function fetchScheduleVersion(projectId: number, version: number, signal?: AbortSignal) {
  return apiClient.get(`/api/projects/${projectId}/schedules/${version}`, { schema: scheduleResponseSchema, signal });
}

export function scheduleVersionQueryOptions(projectId: number, version: number) {
  return queryOptions({
    queryKey: scheduleKeys.detail(projectId, version),
    queryFn: ({ signal }) => fetchScheduleVersion(projectId, version, signal),
    // A stored version never changes.
    staleTime: Infinity,
  });
}

export function useScheduleVersion(projectId: number, version: number | undefined) {
  return useQuery({ ...scheduleVersionQueryOptions(projectId, version ?? 0), enabled: version !== undefined });
}
