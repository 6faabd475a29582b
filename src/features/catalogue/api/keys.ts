import type { z } from 'zod';
import type { productListQuerySchema } from '../../../../shared/schemas/price-list.schema';

export type ProductFilters = Partial<z.input<typeof productListQuerySchema>>;

/** Query keys of the merchant's catalogue: branches, stock per branch, products and roof systems. Invalidate by prefix. */
export const catalogueKeys = {
  all: ['catalogue'] as const,
  branches: () => [...catalogueKeys.all, 'branches'] as const,
  stockAll: () => [...catalogueKeys.all, 'stock'] as const,
  stock: (branchId: number) => [...catalogueKeys.stockAll(), branchId] as const,
  products: () => [...catalogueKeys.all, 'products'] as const,
  productLists: () => [...catalogueKeys.products(), 'list'] as const,
  productList: (filters: ProductFilters) => [...catalogueKeys.productLists(), filters] as const,
  systems: () => [...catalogueKeys.all, 'roof-systems'] as const,
  systemLists: () => [...catalogueKeys.systems(), 'list'] as const,
  systemList: (branchId: number) => [...catalogueKeys.systemLists(), branchId] as const,
};

export type SheetKind = 'price-list' | 'stock-counts';
export const sheetExportUrl = (branchId: number, kind: SheetKind, format: 'csv' | 'xlsx') => `/api/branches/${branchId}/${kind}?format=${format}`;
