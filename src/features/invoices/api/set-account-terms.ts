import { useMutation, useQueryClient } from '@tanstack/react-query';
import { accountSchema } from '../../../../shared/schemas/invoice.schema';
import { apiClient } from '../../../lib/api-client';
import { accountKeys } from './account-keys';

/**
 * Terms in days from the invoice date to the due date, and whether account invoices may be paid by
 * card too; null removes the account (the contractor pays by card).
 */
export function setAccountTerms(contractorId: number, terms: { terms_days: number; card_payments?: boolean } | null) {
  return terms === null ? apiClient.delete(`/api/accounts/${contractorId}`, { schema: accountSchema }) : apiClient.put(`/api/accounts/${contractorId}`, { body: terms, schema: accountSchema });
}

export function useSetAccountTerms(contractorId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (terms: { terms_days: number; card_payments?: boolean } | null) => setAccountTerms(contractorId, terms),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: accountKeys.lists() }),
  });
}
