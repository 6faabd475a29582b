import { queryOptions, useQuery } from '@tanstack/react-query';
import { projectSchema } from '../../../../shared/schemas/project.schema';
import { apiClient } from '../../../lib/api-client';
import { projectKeys } from './keys';

export function fetchProject(id: number, signal?: AbortSignal) {
  return apiClient.get(`/api/projects/${id}`, { schema: projectSchema, signal });
}

export function projectQueryOptions(id: number) {
  return queryOptions({
    queryKey: projectKeys.detail(id),
    queryFn: ({ signal }) => fetchProject(id, signal),
  });
}

/** `enabled` waits for an id that comes from another query (an estimate's site). */
export function useProject(id: number, enabled = true) {
  return useQuery({ ...projectQueryOptions(id), enabled: enabled && id > 0 });
}
