import type { QueryClient } from '@tanstack/react-query';
import type { Run } from '../../../../shared/schemas/run.schema';
import { runKeys } from './keys';

/**
 * Changes one run wherever it is cached (its own page and any day plan holding it), so a tick shows at
 * once; the caller refetches afterwards to take the server's word.
 */
export function patchCachedRun(queryClient: QueryClient, runId: number, change: (run: Run) => Run): void {
  queryClient.setQueryData<Run>(runKeys.detail(runId), (run) => (run ? change(run) : run));
  queryClient.setQueriesData<Run[]>({ queryKey: runKeys.days() }, (day) => (day ? day.map((run) => (run.id === runId ? change(run) : run)) : day));
}

/** Everything about runs is asked again: the day plans, weeks, run pages and pallet pages. */
export function refetchRuns(queryClient: QueryClient) {
  return queryClient.invalidateQueries({ queryKey: runKeys.all });
}
