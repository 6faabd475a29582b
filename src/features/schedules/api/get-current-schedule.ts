import { queryOptions, useQuery } from '@tanstack/react-query';
import * as z from 'zod/mini';
import { scheduleResponseSchema } from '../../../../shared/schemas/schedule-upload.schema';
import type { ScheduleResponse } from '../../../../shared/schemas/schedule-upload.schema';
import { apiClient } from '../../../lib/api-client';
import { scheduleKeys } from './keys';

/**
 * The schedule in use on a site, or null before the first import. Asked with optional=1, so the server
 * answers null rather than 404 and the page logs no failed request.
 */
export async function fetchCurrentSchedule(projectId: number, signal?: AbortSignal): Promise<ScheduleResponse | null> {
  return apiClient.get(`/api/projects/${projectId}/schedule?optional=1`, { schema: z.nullable(scheduleResponseSchema), signal });
}

export function currentScheduleQueryOptions(projectId: number) {
  return queryOptions({
    queryKey: scheduleKeys.current(projectId),
    queryFn: ({ signal }) => fetchCurrentSchedule(projectId, signal),
  });
}

export function useCurrentSchedule(projectId: number) {
  return useQuery(currentScheduleQueryOptions(projectId));
}
