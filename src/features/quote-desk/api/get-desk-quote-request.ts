import { queryOptions, useQuery } from '@tanstack/react-query';
import { quoteRequestSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteDeskKeys } from './keys';

export function fetchDeskQuoteRequest(id: number, signal?: AbortSignal) {
  return apiClient.get(`/api/quote-requests/${id}`, { schema: quoteRequestSchema, signal });
}

export function deskQuoteRequestQueryOptions(id: number) {
  return queryOptions({ queryKey: quoteDeskKeys.detail(id), queryFn: ({ signal }) => fetchDeskQuoteRequest(id, signal) });
}

export function useDeskQuoteRequest(id: number) {
  return useQuery(deskQuoteRequestQueryOptions(id));
}
