import { queryOptions, useQuery } from '@tanstack/react-query';
import { productListSchema } from '../../../../shared/schemas/price-list.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';
import type { ProductFilters } from './keys';

export function fetchProducts(filters: ProductFilters, signal?: AbortSignal) {
  const params = new URLSearchParams();
  if (filters.q) params.set('q', filters.q);
  if (filters.category) params.set('category', filters.category);
  if (filters.archived) params.set('archived', filters.archived);
  const search = params.toString();
  return apiClient.get(`/api/products${search ? `?${search}` : ''}`, { schema: productListSchema, signal }).then((r) => r.products);
}

export const productsQuery = (filters: ProductFilters) => queryOptions({ queryKey: catalogueKeys.productList(filters), queryFn: ({ signal }) => fetchProducts(filters, signal) });

/** The merchant's products; `archived` 'false' (the default), 'true' or 'all'. */
export function useProducts(filters: ProductFilters) {
  return useQuery(productsQuery(filters));
}
