import { queryOptions, useQuery } from '@tanstack/react-query';
import { organisationSchema } from '../../../../shared/schemas/members.schema';
import { apiClient } from '../../../lib/api-client';
import { organisationKeys } from './keys';

export function fetchOrganisation(signal?: AbortSignal) {
  return apiClient.get('/api/organisation', { schema: organisationSchema, signal });
}

export function organisationQueryOptions() {
  return queryOptions({
    queryKey: organisationKeys.detail('current'),
    queryFn: ({ signal }) => fetchOrganisation(signal),
  });
}

export function useOrganisation() {
  return useQuery(organisationQueryOptions());
}
