import { useMutation, useQueryClient } from '@tanstack/react-query';
import { productSchema } from '../../../../shared/schemas/price-list.schema';
import type { CreateProductBody } from '../../../../shared/schemas/price-list.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

/** Adds a product to the merchant's catalogue; 409 sku_taken names the sku field, 422 names each bad field. */
export function createProduct(body: CreateProductBody) {
  return apiClient.post('/api/products', { body, schema: productSchema });
}

export function useCreateProduct() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: createProduct, onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKeys.products() }) });
}
