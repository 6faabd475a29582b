import * as z from 'zod/mini';
import { orderDetailSchema } from '../../../../shared/schemas/order.schema';
import type { ProposalBody } from '../../../../shared/schemas/order.schema';
import { apiClient } from '../../../lib/api-client';
import { useOrderMutation } from './use-order-mutation';

const offerResultSchema = z.object({ proposal_id: z.number().check(z.int()), order: orderDetailSchema });

/** Part quantities, back-orders, substitutes or another day, for the contractor to accept or decline. */
export async function offerChanges(orderId: number, body: ProposalBody) {
  const result = await apiClient.post(`/api/orders/${orderId}/proposals`, { body, schema: offerResultSchema });
  return result.order;
}

export function useOfferChanges(orderId: number) {
  return useOrderMutation(orderId, (body: ProposalBody) => offerChanges(orderId, body));
}
