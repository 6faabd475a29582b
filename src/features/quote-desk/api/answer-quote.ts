import { useMutation, useQueryClient } from '@tanstack/react-query';
import { quoteRequestSchema } from '../../../../shared/schemas/order.schema';
import type { AnswerQuoteBody, QuoteRequest } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteDeskKeys } from './keys';

/** Prices the branch's quote; the desk may answer again while the request is open. */
export function answerQuote(quoteId: number, body: AnswerQuoteBody) {
  return apiClient.post(`/api/quotes/${quoteId}/answer`, { body, schema: quoteRequestSchema });
}

export function useQuoteDeskMutation<TVars>(mutationFn: (vars: TVars) => Promise<QuoteRequest>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn,
    onSuccess: (request) => {
      queryClient.setQueryData(quoteDeskKeys.detail(request.id), request);
      return queryClient.invalidateQueries({ queryKey: quoteDeskKeys.lists() });
    },
  });
}

export function useAnswerQuote(quoteId: number) {
  return useQuoteDeskMutation((body: AnswerQuoteBody) => answerQuote(quoteId, body));
}
