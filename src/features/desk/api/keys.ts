import type { ORDER_DATE_FIELDS, ORDER_SORTS } from '../../../../shared/schemas/order.schema';

/** The order book's query as the page sends it (see orderBookQuerySchema). */
export interface OrderBookFilters {
  /** A comma list of stages, e.g. "sent,agreed". */
  statuses?: string;
  branch_id?: number;
  q?: string;
  sort: (typeof ORDER_SORTS)[number];
  dir: 'asc' | 'desc';
  page: number;
  page_size: number;
  date_from?: string;
  date_to?: string;
  date_field: (typeof ORDER_DATE_FIELDS)[number];
}

/** Query keys of the merchant's order desk. Invalidate by prefix. */
export const deskKeys = {
  all: ['desk'] as const,
  orders: () => [...deskKeys.all, 'orders'] as const,
  orderList: (filters: OrderBookFilters) => [...deskKeys.orders(), 'list', filters] as const,
  orderDetail: (id: number) => [...deskKeys.orders(), 'detail', id] as const,
  substitutes: (orderId: number, lineId: number, revision: number) => [...deskKeys.orderDetail(orderId), 'substitutes', lineId, revision] as const,
  branches: () => [...deskKeys.all, 'branches'] as const,
  stock: (branchId: number) => [...deskKeys.all, 'stock', branchId] as const,
  slots: (branchId: number, date: string) => [...deskKeys.all, 'slots', branchId, date] as const,
};
