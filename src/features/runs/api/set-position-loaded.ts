import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { patchCachedRun, refetchRuns } from './run-cache';

/** Ticks (POST) or unticks (DELETE) one deck position as loaded; `index` is into the run's deck.positions. */
export function setPositionLoaded(runId: number, index: number, loaded: boolean) {
  const path = `/api/runs/${runId}/positions/${index}/loaded`;
  return loaded ? apiClient.post(path, { body: {} }) : apiClient.delete(path);
}

export interface PositionLoadedVars {
  index: number;
  loaded: boolean;
}

export function useSetPositionLoaded(runId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ index, loaded }: PositionLoadedVars) => setPositionLoaded(runId, index, loaded),
    onMutate: ({ index, loaded }) =>
      patchCachedRun(queryClient, runId, (run) => {
        const was = run.deck.positions[index]?.loaded;
        if (was === undefined || was === loaded) return run;
        const positions = run.deck.positions.map((p, i) => (i === index ? { ...p, loaded } : p));
        return { ...run, loaded_count: run.loaded_count + (loaded ? 1 : -1), deck: { ...run.deck, positions } };
      }),
    onSettled: () => refetchRuns(queryClient),
  });
}
