import { queryOptions, useQuery } from '@tanstack/react-query';
import { loadingSheetSchema } from '../../../../shared/schemas/slot.schema';
import { apiClient } from '../../../lib/api-client';
import { deliveryKeys } from './keys';

/** A driver's runs on a day; the dispatcher names the driver. */
export function fetchLoadingSheet(date: string, driverId?: number, signal?: AbortSignal) {
  const params = new URLSearchParams({ date });
  if (driverId) params.set('driver_id', String(driverId));
  return apiClient.get(`/api/deliveries?${params.toString()}`, { schema: loadingSheetSchema, signal });
}

export function loadingSheetQueryOptions(date: string, driverId?: number) {
  return queryOptions({ queryKey: deliveryKeys.sheet(date, driverId), queryFn: ({ signal }) => fetchLoadingSheet(date, driverId, signal) });
}

export function useLoadingSheet(date: string, driverId?: number) {
  return useQuery({ ...loadingSheetQueryOptions(date, driverId), enabled: /^\d{4}-\d{2}-\d{2}$/.test(date) });
}
