import { useMutation } from '@tanstack/react-query';
import { startPaymentResultSchema } from '../../../../shared/schemas/payment.schema';
import { apiClient } from '../../../lib/api-client';

/** Opens (or returns the open) hosted checkout for the invoice's balance; the card is typed there, never here. */
export function startCardPayment(invoiceId: number) {
  return apiClient.post(`/api/invoices/${invoiceId}/payments`, { body: { method: 'card' }, schema: startPaymentResultSchema });
}

export function useStartCardPayment(invoiceId: number) {
  return useMutation({ mutationFn: () => startCardPayment(invoiceId) });
}
