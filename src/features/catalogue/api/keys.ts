/** Query keys of the merchant's catalogue: branches and stock per branch. Invalidate by prefix. */
export const catalogueKeys = {
  all: ['catalogue'] as const,
  branches: () => [...catalogueKeys.all, 'branches'] as const,
  stock: (branchId: number) => [...catalogueKeys.all, 'stock', branchId] as const,
};

export type SheetKind = 'price-list' | 'stock-counts';
export const sheetExportUrl = (branchId: number, kind: SheetKind, format: 'csv' | 'xlsx') => `/api/branches/${branchId}/${kind}?format=${format}`;
