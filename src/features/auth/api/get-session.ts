import { queryOptions, useQuery } from '@tanstack/react-query';
import { sessionBodySchema } from '../../../../shared/schemas/auth.schema';
import type { SessionBody } from '../../../../shared/schemas/auth.schema';
import { apiClient, isApiError } from '../../../lib/api-client';
import { setBusinessTimeZone } from '../../../lib/business-calendar';
import { authKeys } from './keys';

/** Who is signed in, or null when nobody is (a 401 is an answer here, not a failure). */
export async function fetchSession(signal?: AbortSignal): Promise<SessionBody | null> {
  try {
    const session = await apiClient.get('/api/auth/me', { schema: sessionBodySchema, signal, redirectOnUnauthenticated: false });
    setBusinessTimeZone(session.calendar.time_zone);
    return session;
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
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
