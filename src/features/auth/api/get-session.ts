import { queryOptions, useQuery } from '@tanstack/react-query';
import type { QueryClient } from '@tanstack/react-query';
import type { SessionBody } from '../../../../shared/schemas/auth.schema';
import { adoptSessionSettings } from './adopt-session';
import { fetchSession } from './fetch-session';
import { authKeys } from './keys';

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

/**
 * Keeps a session learned outside the query (signing in, signing up, joining a firm, or the sign-in page's own question) as the
 * answer of the session query. Nothing cached for a previous person may leak into this one's pages.
 */
export function rememberSession(queryClient: QueryClient, session: SessionBody | null): void {
  queryClient.removeQueries();
  adoptSessionSettings(session);
  queryClient.setQueryData(authKeys.session(), session);
}
