import { useMutation, useQueryClient } from '@tanstack/react-query';
import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { orderKeys } from './keys';

export type ProposalAnswer = 'accept' | 'decline';

/** The contractor's answer to the merchant's offered changes: all of them, or none. */
export function answerProposal(orderId: number, proposalId: number, answer: ProposalAnswer, note?: string) {
  return apiClient.post(`/api/orders/${orderId}/proposals/${proposalId}/${answer}`, { body: note ? { note } : {}, schema: orderDetailSchema });
}

export function useAnswerProposal(orderId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ proposalId, answer, note }: { proposalId: number; answer: ProposalAnswer; note?: string }) => answerProposal(orderId, proposalId, answer, note),
    onSuccess: (order) => {
      queryClient.setQueryData(orderKeys.detail(order.id), order);
      return queryClient.invalidateQueries({ queryKey: orderKeys.lists() });
    },
  });
}
