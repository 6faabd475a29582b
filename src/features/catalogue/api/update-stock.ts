import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { stockItemSchema } from '../../../../shared/schemas/stock.schema';
import type { updateStockBodySchema } from '../../../../shared/schemas/stock.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

export type UpdateStockBody = z.input<typeof updateStockBodySchema>;

/** A new count or reorder level for one product at one branch; 409 below_reserved when on hand would fall under what is reserved. */
export function updateStock(branchId: number, productId: number, body: UpdateStockBody) {
  return apiClient.patch(`/api/branches/${branchId}/stock/${productId}`, { body, schema: stockItemSchema });
}

export function useUpdateStock(branchId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ productId, body }: { productId: number; body: UpdateStockBody }) => updateStock(branchId, productId, body),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: catalogueKeys.stock(branchId) }),
        // A product's own figures list its stock at every branch.
        queryClient.invalidateQueries({ queryKey: catalogueKeys.products() }),
      ]),
  });
}
