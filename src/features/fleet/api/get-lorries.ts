import { queryOptions, useQuery } from '@tanstack/react-query';
import { lorryListSchema } from '../../../../shared/schemas/fleet.schema';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

/** A branch's lorries; with `withArchived` the archived ones come too (each carries its `archived_at`). */
export function fetchLorries(branchId: number, signal?: AbortSignal, withArchived = false) {
  return apiClient.get(`/api/branches/${branchId}/lorries${withArchived ? '?archived=true' : ''}`, { schema: lorryListSchema, signal });
}

export function useLorries(branchId: number) {
  return useQuery(queryOptions({ queryKey: fleetKeys.lorries(branchId), queryFn: ({ signal }) => fetchLorries(branchId, signal) }));
}

/** Every lorry of the branch, archived ones included; fetched only while `enabled` (the archived list is open). */
export function useLorriesWithArchived(branchId: number, enabled: boolean) {
  return useQuery({
    ...queryOptions({ queryKey: fleetKeys.lorriesWithArchived(branchId), queryFn: ({ signal }) => fetchLorries(branchId, signal, true) }),
    enabled,
  });
}
