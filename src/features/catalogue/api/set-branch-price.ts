import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { productSchema } from '../../../../shared/schemas/price-list.schema';
import type { branchPriceBodySchema } from '../../../../shared/schemas/price-list.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

export type BranchPriceBody = z.input<typeof branchPriceBodySchema>;

/** The price of one pack of a product at a branch, in minor units. */
export function setBranchPrice(branchId: number, productId: number, body: BranchPriceBody) {
  return apiClient.put(`/api/branches/${branchId}/products/${productId}`, { body, schema: productSchema });
}

export function useSetBranchPrice(branchId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ productId, body }: { productId: number; body: BranchPriceBody }) => setBranchPrice(branchId, productId, body),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: catalogueKeys.stock(branchId) }),
        queryClient.invalidateQueries({ queryKey: catalogueKeys.products() }),
        // Roof system offers are priced from the branch's prices.
        queryClient.invalidateQueries({ queryKey: catalogueKeys.systems() }),
      ]),
  });
}
