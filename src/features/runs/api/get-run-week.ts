import { queryOptions, useQuery } from '@tanstack/react-query';
import { runWeekSchema } from '../../../../shared/schemas/run.schema';
import { isIsoDate } from '../../../../shared/domain/business-calendar';
import { apiClient } from '../../../lib/api-client';
import { LIVE_BOARD } from '../../../lib/live-board';
import { runKeys } from './keys';

/** A branch's runs for the week from `from` (a Monday): a summary per run, no deck. */
export function fetchRunWeek(branchId: number, from: string, signal?: AbortSignal) {
  return apiClient.get(`/api/branches/${branchId}/run-week?from=${encodeURIComponent(from)}`, { schema: runWeekSchema, signal });
}

export function runWeekQueryOptions(branchId: number, from: string) {
  return queryOptions({ queryKey: runKeys.week(branchId, from), queryFn: ({ signal }) => fetchRunWeek(branchId, from, signal) });
}

export function useRunWeek(branchId: number, from: string) {
  return useQuery({ ...runWeekQueryOptions(branchId, from), ...LIVE_BOARD, enabled: isIsoDate(from) });
}
