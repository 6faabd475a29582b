import { queryOptions, useQuery } from '@tanstack/react-query';
import { scheduleHistorySchema } from '../../../../shared/schemas/schedule-upload.schema';
import { apiClient } from '../../../lib/api-client';
import { scheduleKeys } from './keys';

export function fetchScheduleHistory(projectId: number, signal?: AbortSignal) {
  return apiClient.get(`/api/projects/${projectId}/schedules`, { schema: scheduleHistorySchema, signal });
}

export function scheduleHistoryQueryOptions(projectId: number) {
  return queryOptions({
    queryKey: scheduleKeys.list(projectId),
    queryFn: ({ signal }) => fetchScheduleHistory(projectId, signal),
    // Newest first, whatever order the server keeps them in.
    select: (body) => [...body.schedules].sort((a, b) => b.version - a.version),
  });
}

export function useScheduleHistory(projectId: number) {
  return useQuery(scheduleHistoryQueryOptions(projectId));
}
