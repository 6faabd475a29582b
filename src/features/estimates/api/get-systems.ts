import { queryOptions, useQuery } from '@tanstack/react-query';
import { systemsListSchema } from '../../../../shared/schemas/catalogue.schema';
import { apiClient } from '../../../lib/api-client';
import { systemKeys } from './keys';
import type { SystemFilters } from './keys';

export function fetchSystems(filters: SystemFilters, signal?: AbortSignal) {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value !== undefined) params.set(key, String(value));
  const query = params.toString();
  return apiClient.get(`/api/systems${query ? `?${query}` : ''}`, { schema: systemsListSchema, signal });
}

export function systemsQueryOptions(filters: SystemFilters = {}) {
  return queryOptions({
    queryKey: systemKeys.list(filters),
    queryFn: ({ signal }) => fetchSystems(filters, signal),
    select: (body) => body.systems,
  });
}

export function useSystems(filters: SystemFilters = {}) {
  return useQuery(systemsQueryOptions(filters));
}
