import { queryOptions, useQuery } from '@tanstack/react-query';
import { accountListSchema } from '../../../../shared/schemas/invoice.schema';
import { apiClient } from '../../../lib/api-client';
import { accountKeys } from './account-keys';

/** Contractors that have ordered from the merchant or have terms with it. */
export function fetchAccounts(signal?: AbortSignal) {
  return apiClient.get('/api/accounts', { schema: accountListSchema, signal });
}

export function accountsQueryOptions() {
  return queryOptions({ queryKey: accountKeys.list(), queryFn: ({ signal }) => fetchAccounts(signal), select: (body) => body.accounts });
}

export function useAccounts() {
  return useQuery(accountsQueryOptions());
}
