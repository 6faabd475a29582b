import type { QUOTE_REQUEST_SORTS, QUOTE_REQUEST_STATUSES } from '../../../../shared/schemas/order.schema';

/** The firm's quote-request list query as the page sends it (see quoteRequestListQuerySchema). */
export interface QuoteRequestFilters {
  status?: (typeof QUOTE_REQUEST_STATUSES)[number];
  q?: string;
  sort: (typeof QUOTE_REQUEST_SORTS)[number];
  dir: 'asc' | 'desc';
  page: number;
  page_size: number;
}

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
