import { paymentSchema } from '../../../../shared/schemas/invoice.schema';
import { apiClient } from '../../../lib/api-client';

/** Asks the provider how a checkout stands, for when its event has not arrived yet. */
export function refreshPayment(paymentId: number) {
  return apiClient.post(`/api/payments/${paymentId}/refresh`, { body: {}, schema: paymentSchema });
}
