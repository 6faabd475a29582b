import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { invoiceListSchema } from '../../../../shared/schemas/invoice.schema';
import { apiClient } from '../../../lib/api-client';
import { invoiceKeys } from './keys';

export function fetchInvoices(filters: { status?: string; page: number }, signal?: AbortSignal) {
  const params = new URLSearchParams({ page: String(filters.page), page_size: '50' });
  if (filters.status) params.set('status', filters.status);
  return apiClient.get(`/api/invoices?${params.toString()}`, { schema: invoiceListSchema, signal });
}

export function invoicesQueryOptions(filters: { status?: string; page: number }) {
  return queryOptions({ queryKey: invoiceKeys.list(filters), queryFn: ({ signal }) => fetchInvoices(filters, signal), placeholderData: keepPreviousData });
}

export function useInvoices(filters: { status?: string; page: number }) {
  return useQuery(invoicesQueryOptions(filters));
}
