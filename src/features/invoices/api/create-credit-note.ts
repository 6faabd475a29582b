import { useMutation, useQueryClient } from '@tanstack/react-query';
import { invoiceSchema } from '../../../../shared/schemas/invoice.schema';
import type { CreditNoteBody } from '../../../../shared/schemas/invoice.schema';
import { apiClient } from '../../../lib/api-client';
import { invoiceKeys } from './keys';

export function createCreditNote(invoiceId: number, body: CreditNoteBody) {
  return apiClient.post(`/api/invoices/${invoiceId}/credit-notes`, { body, schema: invoiceSchema });
}

export function useCreateCreditNote(invoiceId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreditNoteBody) => createCreditNote(invoiceId, body),
    onSuccess: (invoice) => {
      queryClient.setQueryData(invoiceKeys.detail(invoice.id), invoice);
      return queryClient.invalidateQueries({ queryKey: invoiceKeys.lists() });
    },
  });
}
