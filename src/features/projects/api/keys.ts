import type { ProjectListQuery } from '../../../../shared/schemas/project.schema';

export type ProjectFilters = Pick<ProjectListQuery, 'q' | 'sort' | 'dir' | 'archived' | 'page' | 'page_size'>;

/** Query keys of the sites feature (projects in the API). Invalidate by prefix. */
export const projectKeys = {
  all: ['projects'] as const,
  lists: () => [...projectKeys.all, 'list'] as const,
  list: (filters: ProjectFilters = {}) => [...projectKeys.lists(), filters] as const,
  details: () => [...projectKeys.all, 'detail'] as const,
  detail: (id: number) => [...projectKeys.details(), id] as const,
};
