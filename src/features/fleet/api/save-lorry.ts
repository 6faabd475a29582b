import { useMutation, useQueryClient } from '@tanstack/react-query';
import { lorrySchema } from '../../../../shared/schemas/fleet.schema';
import type { CreateLorryBody, UpdateLorryBody } from '../../../../shared/schemas/fleet.schema';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

export function createLorry(branchId: number, body: CreateLorryBody) {
  return apiClient.post(`/api/branches/${branchId}/lorries`, { body, schema: lorrySchema });
}

export function updateLorry(lorryId: number, body: UpdateLorryBody) {
  return apiClient.patch(`/api/lorries/${lorryId}`, { body, schema: lorrySchema });
}

/** Adds a lorry to the branch, or changes one when `lorryId` is given; the branch's lorries and slots are refetched. */
export function useSaveLorry(branchId: number, lorryId?: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateLorryBody) => (lorryId === undefined ? createLorry(branchId, body) : updateLorry(lorryId, body)),
    onSuccess: () => Promise.all([queryClient.invalidateQueries({ queryKey: fleetKeys.lorries(branchId) }), queryClient.invalidateQueries({ queryKey: [...fleetKeys.all, 'slots', branchId] })]),
  });
}
