/** Query keys of the roof schedule feature: each site's current schedule, its history and each version. */
export const scheduleKeys = {
  all: ['schedules'] as const,
  ofProject: (projectId: number) => [...scheduleKeys.all, 'project', projectId] as const,
  current: (projectId: number) => [...scheduleKeys.ofProject(projectId), 'current'] as const,
  lists: (projectId: number) => [...scheduleKeys.ofProject(projectId), 'list'] as const,
  list: (projectId: number) => [...scheduleKeys.lists(projectId), {}] as const,
  details: (projectId: number) => [...scheduleKeys.ofProject(projectId), 'detail'] as const,
  detail: (projectId: number, version: number) => [...scheduleKeys.details(projectId), version] as const,
};
