import { queryOptions, useQuery } from '@tanstack/react-query';
import { quoteRequestListSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteDeskKeys } from './keys';

/** The server scopes the list to the caller: a merchant sees only the requests sent to its branches. */
export function fetchDeskQuoteRequests(signal?: AbortSignal) {
  return apiClient.get('/api/quote-requests', { schema: quoteRequestListSchema, signal });
}

export function deskQuoteRequestsQueryOptions() {
  return queryOptions({
    queryKey: quoteDeskKeys.list(),
    queryFn: ({ signal }) => fetchDeskQuoteRequests(signal),
    select: (body) => body.quote_requests,
  });
}

export function useDeskQuoteRequests() {
  return useQuery(deskQuoteRequestsQueryOptions());
}
