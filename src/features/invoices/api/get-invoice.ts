import { queryOptions, useQuery } from '@tanstack/react-query';
import { invoiceSchema } from '../../../../shared/schemas/invoice.schema';
import { apiClient } from '../../../lib/api-client';
import { invoiceKeys } from './keys';

export function fetchInvoice(id: number, signal?: AbortSignal) {
  return apiClient.get(`/api/invoices/${id}`, { schema: invoiceSchema, signal });
}

export function invoiceQueryOptions(id: number) {
  return queryOptions({ queryKey: invoiceKeys.detail(id), queryFn: ({ signal }) => fetchInvoice(id, signal) });
}

export function useInvoice(id: number) {
  return useQuery(invoiceQueryOptions(id));
}
