import { useMutation, useQueryClient } from '@tanstack/react-query';
import { quoteRequestSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { quoteKeys } from './keys';

export function withdrawQuoteRequest(id: number) {
  return apiClient.post(`/api/quote-requests/${id}/withdraw`, { schema: quoteRequestSchema });
}

export function useWithdrawQuoteRequest() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: withdrawQuoteRequest,
    onSuccess: (request) => {
      queryClient.setQueryData(quoteKeys.detail(request.id), request);
      return queryClient.invalidateQueries({ queryKey: quoteKeys.lists() });
    },
  });
}
