import { queryOptions, useQuery } from '@tanstack/react-query';
import { driverListSchema } from '../../../../shared/schemas/fleet.schema';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

export function fetchDrivers(signal?: AbortSignal) {
  return apiClient.get('/api/drivers', { schema: driverListSchema, signal });
}

export function useDrivers() {
  return useQuery(queryOptions({ queryKey: fleetKeys.drivers(), queryFn: ({ signal }) => fetchDrivers(signal), staleTime: 5 * 60_000 }));
}
