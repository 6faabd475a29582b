import { queryOptions, useQuery } from '@tanstack/react-query';
import { stockListSchema } from '../../../../shared/schemas/stock.schema';
import { apiClient } from '../../../lib/api-client';
import { deskKeys } from './keys';

export function fetchBranchStock(branchId: number, signal?: AbortSignal) {
  return apiClient.get(`/api/branches/${branchId}/stock`, { schema: stockListSchema, signal });
}

export function branchStockQueryOptions(branchId: number) {
  return queryOptions({ queryKey: deskKeys.stock(branchId), queryFn: ({ signal }) => fetchBranchStock(branchId, signal) });
}

export function useBranchStock(branchId: number) {
  return useQuery(branchStockQueryOptions(branchId));
}
