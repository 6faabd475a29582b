import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { setDropOrderBodySchema } from '../../../../shared/schemas/run.schema';
import { apiClient } from '../../../lib/api-client';
import { refetchRuns } from './run-cache';

export type SetDropOrderBody = z.input<typeof setDropOrderBodySchema>;

/** Sets the order the drops come off the lorry (first = first off); the server plans the deck again. */
export function setDropOrder(runId: number, body: SetDropOrderBody) {
  return apiClient.put(`/api/runs/${runId}/drops`, { body });
}

export function useSetDropOrder(runId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (orderIds: number[]) => setDropOrder(runId, { order_ids: orderIds }),
    onSettled: () => refetchRuns(queryClient),
  });
}
