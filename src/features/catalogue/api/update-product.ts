import { useMutation, useQueryClient } from '@tanstack/react-query';
import { productSchema } from '../../../../shared/schemas/price-list.schema';
import type { UpdateProductBody } from '../../../../shared/schemas/price-list.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

export function updateProduct(productId: number, body: UpdateProductBody) {
  return apiClient.patch(`/api/products/${productId}`, { body, schema: productSchema });
}

/** Changes a product; stock rows and roof systems show its name and SKU, so they are refetched too. */
export function useUpdateProduct(productId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateProductBody) => updateProduct(productId, body),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: catalogueKeys.products() }),
        queryClient.invalidateQueries({ queryKey: catalogueKeys.stockAll() }),
        queryClient.invalidateQueries({ queryKey: catalogueKeys.systems() }),
      ]),
  });
}
