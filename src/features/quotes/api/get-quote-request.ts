import { queryOptions, useQuery } from '@tanstack/react-query';
import { quoteRequestSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteKeys } from './keys';

export function fetchQuoteRequest(id: number, signal?: AbortSignal) {
  return apiClient.get(`/api/quote-requests/${id}`, { schema: quoteRequestSchema, signal });
}

export function quoteRequestQueryOptions(id: number) {
  return queryOptions({
    queryKey: quoteKeys.detail(id),
    queryFn: ({ signal }) => fetchQuoteRequest(id, signal),
  });
}

export function useQuoteRequest(id: number) {
  return useQuery(quoteRequestQueryOptions(id));
}
