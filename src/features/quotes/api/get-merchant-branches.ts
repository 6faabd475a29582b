import { queryOptions, useQuery } from '@tanstack/react-query';
import { merchantBranchesListSchema } from '../../../../shared/schemas/catalogue.schema';
import { apiClient } from '../../../lib/api-client';
import { merchantBranchKeys } from './keys';

export function fetchMerchantBranches(signal?: AbortSignal) {
  return apiClient.get('/api/merchant-branches', { schema: merchantBranchesListSchema, signal });
}

export function merchantBranchesQueryOptions() {
  return queryOptions({
    queryKey: merchantBranchKeys.list(),
    queryFn: ({ signal }) => fetchMerchantBranches(signal),
    select: (body) => [...body.branches].sort((a, b) => a.merchant.name.localeCompare(b.merchant.name) || a.name.localeCompare(b.name)),
    staleTime: 5 * 60_000,
  });
}

export function useMerchantBranches() {
  return useQuery(merchantBranchesQueryOptions());
}
