import { queryOptions, useQuery } from '@tanstack/react-query';
import { organisationSchema } from '../../../../shared/schemas/members.schema';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

export function fetchYardBranches(signal?: AbortSignal) {
  return apiClient.get('/api/organisation', { schema: organisationSchema, signal }).then((org) => org.branches);
}

export function useYardBranches() {
  return useQuery(queryOptions({ queryKey: fleetKeys.branches(), queryFn: ({ signal }) => fetchYardBranches(signal), staleTime: 5 * 60_000 }));
}
