import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SHEET_FILE_FIELD, sheetImportResultSchema } from '../../../../shared/schemas/price-list.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';
import type { SheetKind } from './keys';

/** Uploads a price list or stock counts (CSV or .xlsx); 422 invalid_sheet lists every problem by row and column, and nothing is applied. */
export function importSheet(branchId: number, kind: SheetKind, file: File) {
  const body = new FormData();
  body.append(SHEET_FILE_FIELD, file);
  return apiClient.post(`/api/branches/${branchId}/${kind}`, { body, schema: sheetImportResultSchema });
}

export function useImportSheet(branchId: number, kind: SheetKind) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => importSheet(branchId, kind, file),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKeys.stock(branchId) }),
  });
}
