import { queryOptions, useQuery } from '@tanstack/react-query';
import { scheduleResponseSchema } from '../../../../shared/schemas/schedule-upload.schema';
import type { ScheduleResponse } from '../../../../shared/schemas/schedule-upload.schema';
import { apiClient, isApiError } from '../../../lib/api-client';
import { scheduleKeys } from './keys';

/** The schedule in use on a site, or null before the first import (the server answers 404 no_schedule). */
export async function fetchCurrentSchedule(projectId: number, signal?: AbortSignal): Promise<ScheduleResponse | null> {
  try {
    return await apiClient.get(`/api/projects/${projectId}/schedule`, { schema: scheduleResponseSchema, signal });
  } catch (error) {
    if (isApiError(error) && error.code === 'no_schedule') return null;
    throw error;
  }
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
