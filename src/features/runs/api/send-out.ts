import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { sendOutBodySchema } from '../../../../shared/schemas/run.schema';
import { apiClient } from '../../../lib/api-client';
import { refetchRuns } from './run-cache';

export type SendOutBody = z.input<typeof sendOutBodySchema>;

/**
 * The lorry leaves with every drop on it. Refused with 409 `not_today` before or after the run's day
 * and `not_loaded` while a pallet is not ticked, unless an override reason is given.
 */
export function sendOut(runId: number, body: SendOutBody) {
  return apiClient.post(`/api/runs/${runId}/send-out`, { body });
}

export function useSendOut(runId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: SendOutBody) => sendOut(runId, body),
    onSettled: () => refetchRuns(queryClient),
  });
}
