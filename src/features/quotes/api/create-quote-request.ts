import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { quoteRequestSchema } from '../../../../shared/schemas/order.schema';
import type { createQuoteRequestBodySchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteKeys } from './keys';

export type CreateQuoteRequestValues = z.output<typeof createQuoteRequestBodySchema>;

export function createQuoteRequest(body: CreateQuoteRequestValues) {
  return apiClient.post('/api/quote-requests', { body, schema: quoteRequestSchema });
}

export function useCreateQuoteRequest() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createQuoteRequest,
    onSuccess: (request) => {
      queryClient.setQueryData(quoteKeys.detail(request.id), request);
      return queryClient.invalidateQueries({ queryKey: quoteKeys.lists() });
    },
  });
}
