import { queryOptions, useQuery } from '@tanstack/react-query';
import { organisationSchema } from '../../../../shared/schemas/members.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

export function fetchCatalogueBranches(signal?: AbortSignal) {
  return apiClient.get('/api/organisation', { schema: organisationSchema, signal }).then((org) => org.branches);
}

export function useCatalogueBranches() {
  return useQuery(queryOptions({ queryKey: catalogueKeys.branches(), queryFn: ({ signal }) => fetchCatalogueBranches(signal), staleTime: 5 * 60_000 }));
}
