import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { projectSchema } from '../../../../shared/schemas/project.schema';
import type { createProjectBodySchema } from '../../../../shared/schemas/project.schema';
import { apiClient } from '../../../lib/api-client';
import { projectKeys } from './keys';

export type CreateProjectValues = z.output<typeof createProjectBodySchema>;

export function createProject(body: CreateProjectValues) {
  return apiClient.post('/api/projects', { body, schema: projectSchema });
}

export function useCreateProject() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createProject,
    onSuccess: (project) => {
      queryClient.setQueryData(projectKeys.detail(project.id), project);
      return queryClient.invalidateQueries({ queryKey: projectKeys.lists() });
    },
  });
}
