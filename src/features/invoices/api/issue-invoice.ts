import { useMutation, useQueryClient } from '@tanstack/react-query';
import { invoiceSchema } from '../../../../shared/schemas/invoice.schema';
import { apiClient } from '../../../lib/api-client';
import { invoiceKeys } from './keys';

/** Issued from the delivered packs once delivered, else from the confirmed packs; 409 already_invoiced / not_invoiceable. */
export function issueInvoice(orderId: number) {
  return apiClient.post(`/api/orders/${orderId}/invoice`, { body: {}, schema: invoiceSchema });
}

export function useIssueInvoice() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: issueInvoice,
    onSuccess: (invoice) => {
      queryClient.setQueryData(invoiceKeys.detail(invoice.id), invoice);
      return queryClient.invalidateQueries({ queryKey: invoiceKeys.lists() });
    },
  });
}
