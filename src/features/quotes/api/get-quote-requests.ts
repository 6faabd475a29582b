import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { quoteRequestListSchema } from '../../../../shared/schemas/order.schema';
import { quoteRequestListParams } from '../../../components/quotes/list-filters';
import { apiClient } from '../../../lib/api-client';
import { quoteKeys } from './keys';
import type { QuoteRequestFilters } from './keys';

export function fetchQuoteRequests(filters: QuoteRequestFilters, signal?: AbortSignal) {
  return apiClient.get(`/api/quote-requests?${quoteRequestListParams(filters).toString()}`, { schema: quoteRequestListSchema, signal });
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
