import { queryOptions, useQuery } from '@tanstack/react-query';
import { deliveryProofSchema } from '../../../../shared/schemas/run.schema';
import { apiClient } from '../../../lib/api-client';
import { orderKeys } from './keys';

/** The proof of delivery of an order: receiver, time, signature, photos and what each line came to. */
export function fetchDeliveryProof(orderId: number, signal?: AbortSignal) {
  return apiClient.get(`/api/orders/${orderId}/delivery`, { schema: deliveryProofSchema, signal });
}

export function deliveryProofQueryOptions(orderId: number) {
  return queryOptions({ queryKey: [...orderKeys.detail(orderId), 'delivery-proof'] as const, queryFn: ({ signal }) => fetchDeliveryProof(orderId, signal) });
}

/** Asked only once the order is delivered: before that there is no proof to read. */
export function useDeliveryProof(orderId: number, delivered: boolean) {
  return useQuery({ ...deliveryProofQueryOptions(orderId), enabled: delivered });
}
