import { useMutation, useQueryClient } from '@tanstack/react-query';
import { accountSchema } from '../../../../shared/schemas/invoice.schema';
import { apiClient } from '../../../lib/api-client';
import { accountKeys } from './account-keys';

/** Terms in days from the invoice date to the due date; null removes the account (the contractor pays by card). */
export function setAccountTerms(contractorId: number, termsDays: number | null) {
  return termsDays === null
    ? apiClient.delete(`/api/accounts/${contractorId}`, { schema: accountSchema })
    : apiClient.put(`/api/accounts/${contractorId}`, { body: { terms_days: termsDays }, schema: accountSchema });
}

export function useSetAccountTerms(contractorId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (termsDays: number | null) => setAccountTerms(contractorId, termsDays),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: accountKeys.lists() }),
  });
}
