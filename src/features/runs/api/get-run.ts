import { queryOptions, useQuery } from '@tanstack/react-query';
import { runSchema } from '../../../../shared/schemas/run.schema';
import { apiClient } from '../../../lib/api-client';
import { LIVE_BOARD } from '../../../lib/live-board';
import { runKeys } from './keys';

/** One run (a slot's id) with its drops, deck plan and pick list. */
export function fetchRun(runId: number, signal?: AbortSignal) {
  return apiClient.get(`/api/runs/${runId}`, { schema: runSchema, signal });
}

export function runQueryOptions(runId: number) {
  return queryOptions({ queryKey: runKeys.detail(runId), queryFn: ({ signal }) => fetchRun(runId, signal) });
}

/** Live: the yard ticks pallets from several phones at once. */
export function useRun(runId: number) {
  return useQuery({ ...runQueryOptions(runId), ...LIVE_BOARD, refetchInterval: 20_000 });
}
