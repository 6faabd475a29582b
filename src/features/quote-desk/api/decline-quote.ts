import { quoteRequestSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { useQuoteDeskMutation } from './answer-quote';

export function declineQuote(quoteId: number, message?: string) {
  return apiClient.post(`/api/quotes/${quoteId}/decline`, { body: message ? { message } : {}, schema: quoteRequestSchema });
}

export function useDeclineQuote(quoteId: number) {
  return useQuoteDeskMutation((message: string | undefined) => declineQuote(quoteId, message));
}
