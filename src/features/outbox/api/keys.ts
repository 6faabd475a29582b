export type OutboxFilters = Record<string, never>;

export const outboxKeys = {
  all: ['outbox'] as const,
  lists: () => [...outboxKeys.all, 'list'] as const,
  list: (filters: OutboxFilters = {}) => [...outboxKeys.lists(), filters] as const,
  details: () => [...outboxKeys.all, 'detail'] as const,
  detail: (id: number) => [...outboxKeys.details(), id] as const,
};
