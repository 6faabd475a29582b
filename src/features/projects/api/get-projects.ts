import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { projectListSchema } from '../../../../shared/schemas/project.schema';
import { apiClient } from '../../../lib/api-client';
import { projectKeys } from './keys';
import type { ProjectFilters } from './keys';

function queryString(filters: ProjectFilters): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) {
    if (value !== undefined && value !== '') params.set(key, String(value));
  }
  const text = params.toString();
  return text ? `?${text}` : '';
}

export function fetchProjects(filters: ProjectFilters, signal?: AbortSignal) {
  return apiClient.get(`/api/projects${queryString(filters)}`, { schema: projectListSchema, signal });
}

export function projectsQueryOptions(filters: ProjectFilters = {}) {
  return queryOptions({
    queryKey: projectKeys.list(filters),
    queryFn: ({ signal }) => fetchProjects(filters, signal),
    // Typing in the search box keeps the last rows on screen until the new ones arrive.
    placeholderData: keepPreviousData,
  });
}

export function useProjects(filters: ProjectFilters = {}) {
  return useQuery(projectsQueryOptions(filters));
}
