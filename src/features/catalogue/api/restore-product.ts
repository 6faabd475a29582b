import { useMutation, useQueryClient } from '@tanstack/react-query';
import { productSchema } from '../../../../shared/schemas/price-list.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

export function restoreProduct(productId: number) {
  return apiClient.post(`/api/products/${productId}/restore`, { schema: productSchema });
}

/** Brings an archived product back into the catalogue. */
export function useRestoreProduct() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: restoreProduct,
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: catalogueKeys.products() }),
        queryClient.invalidateQueries({ queryKey: catalogueKeys.stockAll() }),
        queryClient.invalidateQueries({ queryKey: catalogueKeys.systems() }),
      ]),
  });
}
