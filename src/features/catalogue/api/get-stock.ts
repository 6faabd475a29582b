import { queryOptions, useQuery } from '@tanstack/react-query';
import { stockListSchema } from '../../../../shared/schemas/stock.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

export function fetchStock(branchId: number, signal?: AbortSignal) {
  return apiClient.get(`/api/branches/${branchId}/stock`, { schema: stockListSchema, signal });
}

export function useStock(branchId: number) {
  return useQuery(queryOptions({ queryKey: catalogueKeys.stock(branchId), queryFn: ({ signal }) => fetchStock(branchId, signal) }));
}
