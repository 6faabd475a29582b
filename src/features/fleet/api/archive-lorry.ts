import { useMutation, useQueryClient } from '@tanstack/react-query';
import { lorrySchema } from '../../../../shared/schemas/fleet.schema';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

/** Archives a lorry: it takes no new slots and its coming empty slots go; a run with orders still to deliver holds it back (409 lorry_booked). */
export function archiveLorry(lorryId: number) {
  return apiClient.delete(`/api/lorries/${lorryId}`, { schema: lorrySchema });
}

/** Archives a lorry of the branch; the branch's lorry lists (active and archived) and its slots are refetched. */
export function useArchiveLorry(branchId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: archiveLorry,
    onSuccess: () => Promise.all([queryClient.invalidateQueries({ queryKey: fleetKeys.lorries(branchId) }), queryClient.invalidateQueries({ queryKey: [...fleetKeys.all, 'slots', branchId] })]),
  });
}

/** Puts an archived lorry back in service. */
export function restoreLorry(lorryId: number) {
  return apiClient.post(`/api/lorries/${lorryId}/restore`, { schema: lorrySchema });
}

/** Restores a lorry of the branch; the branch's lorry lists are refetched. */
export function useRestoreLorry(branchId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: restoreLorry,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: fleetKeys.lorries(branchId) }),
  });
}
