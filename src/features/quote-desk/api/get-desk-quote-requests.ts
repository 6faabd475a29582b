import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { quoteRequestListSchema } from '../../../../shared/schemas/order.schema';
import { quoteRequestListParams } from '../../../components/quotes/list-filters';
import { apiClient } from '../../../lib/api-client';
import { quoteDeskKeys } from './keys';
import type { DeskQuoteRequestFilters } from './keys';

/** The server scopes the list to the caller: a merchant sees only the requests sent to its branches. */
export function fetchDeskQuoteRequests(filters: DeskQuoteRequestFilters, signal?: AbortSignal) {
  return apiClient.get(`/api/quote-requests?${quoteRequestListParams(filters).toString()}`, { schema: quoteRequestListSchema, signal });
}

export function deskQuoteRequestsQueryOptions(filters: DeskQuoteRequestFilters) {
  return queryOptions({
    queryKey: quoteDeskKeys.list(filters),
    queryFn: ({ signal }) => fetchDeskQuoteRequests(filters, signal),
    // The page stays on screen while the next page or filter loads.
    placeholderData: keepPreviousData,
  });
}

export function useDeskQuoteRequests(filters: DeskQuoteRequestFilters) {
  return useQuery(deskQuoteRequestsQueryOptions(filters));
}
