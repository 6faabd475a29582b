import { queryOptions, useQuery } from '@tanstack/react-query';
import { outboxListSchema } from '../../../../shared/schemas/members.schema';
import { apiClient } from '../../../lib/api-client';
import { outboxKeys } from './keys';

/** The messages the app has sent, newest first; the server offers this only outside production. */
export function fetchOutbox(signal?: AbortSignal) {
  return apiClient.get('/api/dev/outbox', { schema: outboxListSchema, signal, redirectOnUnauthenticated: false });
}

export function outboxQueryOptions() {
  return queryOptions({
    queryKey: outboxKeys.list(),
    queryFn: ({ signal }) => fetchOutbox(signal),
    select: (body) => body.messages,
    // New mail arrives while someone waits for a reset link.
    refetchInterval: 5000,
    retry: false,
  });
}

export function useOutbox() {
  return useQuery(outboxQueryOptions());
}
