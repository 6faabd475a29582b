import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { projectSchema } from '../../../../shared/schemas/project.schema';
import type { updateProjectBodySchema } from '../../../../shared/schemas/project.schema';
import { apiClient } from '../../../lib/api-client';
import { projectKeys } from './keys';

export type UpdateProjectValues = z.output<typeof updateProjectBodySchema>;

export function updateProject(id: number, body: UpdateProjectValues) {
  return apiClient.patch(`/api/projects/${id}`, { body, schema: projectSchema });
}

export function useUpdateProject(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateProjectValues) => updateProject(id, body),
    onSuccess: (project) => {
      queryClient.setQueryData(projectKeys.detail(project.id), project);
      return queryClient.invalidateQueries({ queryKey: projectKeys.lists() });
    },
  });
}
