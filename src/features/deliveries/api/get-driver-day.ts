import { queryOptions, useQuery } from '@tanstack/react-query';
import { driverDaySchema } from '../../../../shared/schemas/run.schema';
import { apiClient } from '../../../lib/api-client';
import { PERSISTED_QUERY_MAX_AGE_MS } from '../../../lib/persisted-queries';
import { deliveryKeys } from './keys';

/** The signed-in driver's runs on a day, each with its drops in order. */
export function fetchDriverDay(date: string, signal?: AbortSignal) {
  return apiClient.get(`/api/driver/runs?${new URLSearchParams({ date }).toString()}`, { schema: driverDaySchema, signal });
}

export function driverDayQueryOptions(driverId: number, date: string) {
  return queryOptions({
    queryKey: deliveryKeys.day(driverId, date),
    queryFn: ({ signal }) => fetchDriverDay(date, signal),
    // Kept on the phone for a day without signal: persisted, and tried once even when the browser
    // says it is offline (the service worker may still answer from its copy).
    meta: { persist: true },
    gcTime: PERSISTED_QUERY_MAX_AGE_MS,
    networkMode: 'offlineFirst',
  });
}

export function useDriverDay(driverId: number, date: string) {
  return useQuery({ ...driverDayQueryOptions(driverId, date), enabled: /^\d{4}-\d{2}-\d{2}$/.test(date) });
}
