import type { QuoteRequestListFilters } from '../../../components/quotes/list-filters';

/** The firm's quote-request list query as the page sends it (see quoteRequestListQuerySchema): never the merchant's `waiting`. */
export type QuoteRequestFilters = Omit<QuoteRequestListFilters, 'waiting'>;

/** Query keys of the quotes feature: quote requests, and the merchant branches they can go to. */
export const quoteKeys = {
  all: ['quote-requests'] as const,
  lists: () => [...quoteKeys.all, 'list'] as const,
  list: (filters: QuoteRequestFilters) => [...quoteKeys.lists(), filters] as const,
  details: () => [...quoteKeys.all, 'detail'] as const,
  detail: (id: number) => [...quoteKeys.details(), id] as const,
};

export const merchantBranchKeys = {
  all: ['merchant-branches'] as const,
  lists: () => [...merchantBranchKeys.all, 'list'] as const,
  list: () => [...merchantBranchKeys.lists(), {}] as const,
};
