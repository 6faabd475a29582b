import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { quoteRequestListSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteDeskKeys } from './keys';
import type { DeskQuoteRequestFilters } from './keys';

/** The server scopes the list to the caller: a merchant sees only the requests sent to its branches. */
export function fetchDeskQuoteRequests(filters: DeskQuoteRequestFilters, signal?: AbortSignal) {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) {
    // "Not only the waiting ones" is the server's default, so it is left out rather than sent as false.
    if (value === undefined || value === '' || value === false) continue;
    params.set(key, String(value));
  }
  return apiClient.get(`/api/quote-requests?${params.toString()}`, { schema: quoteRequestListSchema, signal });
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
