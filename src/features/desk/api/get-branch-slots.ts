import { queryOptions, useQuery } from '@tanstack/react-query';
import { slotDaySchema } from '../../../../shared/schemas/slot.schema';
import { apiClient } from '../../../lib/api-client';
import { deskKeys } from './keys';

export function fetchBranchSlots(branchId: number, date: string, signal?: AbortSignal) {
  return apiClient.get(`/api/branches/${branchId}/slots?date=${encodeURIComponent(date)}`, { schema: slotDaySchema, signal });
}

export function branchSlotsQueryOptions(branchId: number, date: string) {
  return queryOptions({ queryKey: deskKeys.slots(branchId, date), queryFn: ({ signal }) => fetchBranchSlots(branchId, date, signal) });
}

export function useBranchSlots(branchId: number, date: string) {
  return useQuery({ ...branchSlotsQueryOptions(branchId, date), enabled: /^\d{4}-\d{2}-\d{2}$/.test(date) });
}
