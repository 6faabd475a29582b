import { queryOptions, useQuery } from '@tanstack/react-query';
import { runDaySchema } from '../../../../shared/schemas/run.schema';
import { isIsoDate } from '../../../../shared/domain/business-calendar';
import { apiClient } from '../../../lib/api-client';
import { LIVE_BOARD } from '../../../lib/live-board';
import { runKeys } from './keys';

/** Every run of a branch on a day, each with its drops in order, deck plan and pick list. */
export function fetchRunDay(branchId: number, date: string, signal?: AbortSignal) {
  return apiClient.get(`/api/branches/${branchId}/runs?date=${encodeURIComponent(date)}`, { schema: runDaySchema, signal });
}

export function runDayQueryOptions(branchId: number, date: string) {
  return queryOptions({ queryKey: runKeys.day(branchId, date), queryFn: ({ signal }) => fetchRunDay(branchId, date, signal) });
}

export function useRunDay(branchId: number, date: string) {
  return useQuery({ ...runDayQueryOptions(branchId, date), ...LIVE_BOARD, enabled: isIsoDate(date) });
}
