import type { z } from 'zod';
import type { systemsListQuerySchema } from '../../../../shared/schemas/catalogue.schema';

export type SystemFilters = z.input<typeof systemsListQuerySchema>;

/** Query keys of the estimates feature: estimates per site, one estimate, comparisons. */
export const estimateKeys = {
  all: ['estimates'] as const,
  lists: () => [...estimateKeys.all, 'list'] as const,
  list: (projectId: number) => [...estimateKeys.lists(), { projectId }] as const,
  details: () => [...estimateKeys.all, 'detail'] as const,
  detail: (id: number) => [...estimateKeys.details(), id] as const,
  comparisons: () => [...estimateKeys.all, 'compare'] as const,
  comparison: (a: number, b: number) => [...estimateKeys.comparisons(), { a, b }] as const,
};

/** The merchants' roof systems an estimate can be priced from. */
export const systemKeys = {
  all: ['systems'] as const,
  lists: () => [...systemKeys.all, 'list'] as const,
  list: (filters: SystemFilters = {}) => [...systemKeys.lists(), filters] as const,
};
