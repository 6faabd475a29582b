import { useMutation, useQueryClient } from '@tanstack/react-query';
import { acceptQuoteResponseSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteKeys } from './keys';

/** Accepting one merchant's quote turns it into an order at its prices; the other quotes are closed. */
export function acceptQuote(quoteId: number) {
  return apiClient.post(`/api/quotes/${quoteId}/accept`, { schema: acceptQuoteResponseSchema });
}

export function useAcceptQuote() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptQuote,
    onSuccess: (answer) => {
      queryClient.setQueryData(quoteKeys.detail(answer.quote_request.id), answer.quote_request);
      return queryClient.invalidateQueries({ queryKey: quoteKeys.lists() });
    },
  });
}
