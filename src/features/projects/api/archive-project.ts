import { useMutation, useQueryClient } from '@tanstack/react-query';
import { projectSchema } from '../../../../shared/schemas/project.schema';
import { apiClient } from '../../../lib/api-client';
import { projectKeys } from './keys';

/** Archiving hides a finished site from the list and stops new schedules, estimates and orders on it. */
export function setProjectArchived(id: number, archived: boolean) {
  return apiClient.post(`/api/projects/${id}/${archived ? 'archive' : 'restore'}`, { schema: projectSchema });
}

export function useSetProjectArchived(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (archived: boolean) => setProjectArchived(id, archived),
    onSuccess: (project) => {
      queryClient.setQueryData(projectKeys.detail(project.id), project);
      return queryClient.invalidateQueries({ queryKey: projectKeys.lists() });
    },
  });
}
