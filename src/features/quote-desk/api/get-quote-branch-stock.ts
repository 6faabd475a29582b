import { queryOptions, useQuery } from '@tanstack/react-query';
import { stockListSchema } from '../../../../shared/schemas/stock.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteDeskKeys } from './keys';

/** What the quoted branch sells, with its pack prices: the products a quote line can offer. */
export function fetchQuoteBranchStock(branchId: number, signal?: AbortSignal) {
  return apiClient.get(`/api/branches/${branchId}/stock`, { schema: stockListSchema, signal });
}

export function quoteBranchStockQueryOptions(branchId: number) {
  return queryOptions({ queryKey: quoteDeskKeys.stock(branchId), queryFn: ({ signal }) => fetchQuoteBranchStock(branchId, signal), select: (body) => body.items });
}

export function useQuoteBranchStock(branchId: number) {
  return useQuery(quoteBranchStockQueryOptions(branchId));
}
