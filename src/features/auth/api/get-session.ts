import { queryOptions, useQuery } from '@tanstack/react-query';
import { sessionAnswerSchema } from '../../../../shared/schemas/auth.schema';
import type { SessionBody } from '../../../../shared/schemas/auth.schema';
import { apiClient } from '../../../lib/api-client';
import { adoptSessionSettings } from './adopt-session';
import { authKeys } from './keys';

/**
 * Who is signed in, or null when nobody is. The server answers 200 either way, so a signed-out page
 * makes no failed request (and the browser logs no error) just to learn that nobody is signed in.
 */
export async function fetchSession(signal?: AbortSignal): Promise<SessionBody | null> {
  const answer = await apiClient.get('/api/auth/session', { schema: sessionAnswerSchema, signal, redirectOnUnauthenticated: false });
  adoptSessionSettings(answer.session);
  return answer.session;
}

export function sessionQueryOptions() {
  return queryOptions({
    queryKey: authKeys.session(),
    queryFn: ({ signal }) => fetchSession(signal),
    staleTime: 5 * 60_000,
  });
}

export function useSession() {
  return useQuery(sessionQueryOptions());
}
