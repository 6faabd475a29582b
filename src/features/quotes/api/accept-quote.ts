import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { ORDER_STATUSES, quoteRequestSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteKeys } from './keys';

// TODO: use a shared schema for this answer once order.schema.ts exports one.
const acceptQuoteSchema = z.object({
  order: z.object({ id: z.number().int(), status: z.enum(ORDER_STATUSES), reference: z.string() }),
  quote_request: quoteRequestSchema,
});

/** Accepting one merchant's quote turns it into an order at its prices; the other quotes are closed. */
export function acceptQuote(quoteId: number) {
  return apiClient.post(`/api/quotes/${quoteId}/accept`, { schema: acceptQuoteSchema });
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
