import { useMutation, useQueryClient } from '@tanstack/react-query';
import { productSchema } from '../../../../shared/schemas/price-list.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

/** Takes a product out of the catalogue; it stays on old orders and can be restored. */
export function archiveProduct(productId: number) {
  return apiClient.delete(`/api/products/${productId}`, { schema: productSchema });
}

export function useArchiveProduct() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: archiveProduct,
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: catalogueKeys.products() }),
        queryClient.invalidateQueries({ queryKey: catalogueKeys.stockAll() }),
        queryClient.invalidateQueries({ queryKey: catalogueKeys.systems() }),
      ]),
  });
}
