import { queryOptions, useQuery } from '@tanstack/react-query';
import { organisationSchema } from '../../../../shared/schemas/members.schema';
import { apiClient } from '../../../lib/api-client';
import { deskKeys } from './keys';

/** The merchant's own branches, for the order book's branch filter. */
export function fetchDeskBranches(signal?: AbortSignal) {
  return apiClient.get('/api/organisation', { schema: organisationSchema, signal }).then((org) => org.branches);
}

export function deskBranchesQueryOptions() {
  return queryOptions({ queryKey: deskKeys.branches(), queryFn: ({ signal }) => fetchDeskBranches(signal), staleTime: 5 * 60_000 });
}

export function useDeskBranches() {
  return useQuery(deskBranchesQueryOptions());
}
