import { queryOptions, useQuery } from '@tanstack/react-query';
import { slotDaySchema } from '../../../../shared/schemas/slot.schema';
import { apiClient } from '../../../lib/api-client';
import { LIVE_BOARD } from '../../../lib/live-board';
import { fleetKeys } from './keys';

export function fetchSlotDay(branchId: number, date: string, signal?: AbortSignal) {
  return apiClient.get(`/api/branches/${branchId}/slots?date=${encodeURIComponent(date)}`, { schema: slotDaySchema, signal });
}

export function useSlotDay(branchId: number, date: string) {
  return useQuery({ ...queryOptions({ queryKey: fleetKeys.slots(branchId, date), queryFn: ({ signal }) => fetchSlotDay(branchId, date, signal) }), ...LIVE_BOARD, enabled: /^\d{4}-\d{2}-\d{2}$/.test(date) });
}
