import type { QuoteRequestListFilters } from '../../../components/quotes/list-filters';

/** The desk's quote-request list query as the page sends it (see quoteRequestListQuerySchema). */
export type DeskQuoteRequestFilters = QuoteRequestListFilters;

/** Query keys of the desk's quote requests: the requests sent to the merchant's branches, and a branch's stock to price from. */
export const quoteDeskKeys = {
  all: ['quote-desk'] as const,
  lists: () => [...quoteDeskKeys.all, 'list'] as const,
  list: (filters: DeskQuoteRequestFilters) => [...quoteDeskKeys.lists(), filters] as const,
  details: () => [...quoteDeskKeys.all, 'detail'] as const,
  detail: (id: number) => [...quoteDeskKeys.details(), id] as const,
  stock: (branchId: number) => [...quoteDeskKeys.all, 'stock', branchId] as const,
};
