import type { OrderListQuery } from '../../../../shared/schemas/order.schema';

export type OrderFilters = Pick<OrderListQuery, 'status' | 'project_id' | 'q' | 'sort' | 'dir' | 'page' | 'page_size'>;

/** Query keys of the orders feature. Invalidate by prefix. */
export const orderKeys = {
  all: ['orders'] as const,
  lists: () => [...orderKeys.all, 'list'] as const,
  list: (filters: OrderFilters = {}) => [...orderKeys.lists(), filters] as const,
  details: () => [...orderKeys.all, 'detail'] as const,
  detail: (id: number) => [...orderKeys.details(), id] as const,
};
