import { queryOptions, useQuery } from '@tanstack/react-query';
import { quoteRequestListSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteKeys } from './keys';

export function fetchQuoteRequests(signal?: AbortSignal) {
  return apiClient.get('/api/quote-requests', { schema: quoteRequestListSchema, signal });
}

export function quoteRequestsQueryOptions() {
  return queryOptions({
    queryKey: quoteKeys.list(),
    queryFn: ({ signal }) => fetchQuoteRequests(signal),
    select: (body) => body.quote_requests,
  });
}

export function useQuoteRequests() {
  return useQuery(quoteRequestsQueryOptions());
}
