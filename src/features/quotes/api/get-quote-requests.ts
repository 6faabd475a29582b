import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { quoteRequestListSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteKeys } from './keys';
import type { QuoteRequestFilters } from './keys';

export function fetchQuoteRequests(filters: QuoteRequestFilters, signal?: AbortSignal) {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value !== undefined && value !== '') params.set(key, String(value));
  return apiClient.get(`/api/quote-requests?${params.toString()}`, { schema: quoteRequestListSchema, signal });
}

export function quoteRequestsQueryOptions(filters: QuoteRequestFilters) {
  return queryOptions({
    queryKey: quoteKeys.list(filters),
    queryFn: ({ signal }) => fetchQuoteRequests(filters, signal),
    // The page stays on screen while the next page or filter loads.
    placeholderData: keepPreviousData,
  });
}

export function useQuoteRequests(filters: QuoteRequestFilters) {
  return useQuery(quoteRequestsQueryOptions(filters));
}
