import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SCHEDULE_FILE_FIELD, scheduleResponseSchema, type ScheduleResponse } from '../../../../shared/schemas/schedule-upload.schema';
import type { OpeningRowInput } from '../../../../shared/schemas/openings.schema';
import type { ScheduleRowInput } from '../../../../shared/schemas/schedule.schema';
import { apiClient } from '../../../lib/api-client';
import { scheduleKeys } from './keys';

/**
 * Stores a new schedule version from checked rows (PUT /api/projects/:id/schedule). The server
 * checks every row again with the same schema and stores all of them or none.
 */
export function saveSchedule(projectId: number, faces: readonly ScheduleRowInput[], openings: readonly OpeningRowInput[] = []) {
  return apiClient.put(`/api/projects/${projectId}/schedule`, { body: { faces, openings }, schema: scheduleResponseSchema });
}

/**
 * Uploads an openings file for the site's current faces (POST /api/projects/:id/schedule/openings,
 * multipart field `file`): stored as the next version with the same faces and these openings.
 */
export function uploadOpeningsCsv(projectId: number, csv: string, filename: string) {
  const form = new FormData();
  form.append(SCHEDULE_FILE_FIELD, new Blob([csv], { type: 'text/csv' }), filename);
  return apiClient.post(`/api/projects/${projectId}/schedule/openings`, { body: form, schema: scheduleResponseSchema });
}

/**
 * Uploads a CSV file as the site's next version (POST /api/projects/:id/schedule, multipart field
 * `file`). The server reads it with the same engine reader; a refusal names spreadsheet rows.
 */
export function uploadScheduleCsv(projectId: number, csv: string, filename: string) {
  const form = new FormData();
  form.append(SCHEDULE_FILE_FIELD, new Blob([csv], { type: 'text/csv' }), filename);
  return apiClient.post(`/api/projects/${projectId}/schedule`, { body: form, schema: scheduleResponseSchema });
}

function useStoreSchedule<T>(projectId: number, store: (input: T) => Promise<ScheduleResponse>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: store,
    onSuccess: (schedule) => {
      queryClient.setQueryData(scheduleKeys.current(projectId), schedule);
      queryClient.setQueryData(scheduleKeys.detail(projectId, schedule.version), schedule);
      return queryClient.invalidateQueries({ queryKey: scheduleKeys.lists(projectId) });
    },
  });
}

export function useSaveSchedule(projectId: number) {
  return useStoreSchedule(projectId, (input: { faces: readonly ScheduleRowInput[]; openings?: readonly OpeningRowInput[] }) => saveSchedule(projectId, input.faces, input.openings));
}

export function useUploadOpenings(projectId: number) {
  return useStoreSchedule(projectId, (file: { csv: string; filename: string }) => uploadOpeningsCsv(projectId, file.csv, file.filename));
}

export function useUploadSchedule(projectId: number) {
  return useStoreSchedule(projectId, (file: { csv: string; filename: string }) => uploadScheduleCsv(projectId, file.csv, file.filename));
}
