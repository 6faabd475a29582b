import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

/** Removes an empty slot; one with orders booked is refused with 409 slot_booked (move the orders first). */
export function removeSlot(slotId: number) {
  return apiClient.delete(`/api/slots/${slotId}`);
}

export function useRemoveSlot() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: removeSlot,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: [...fleetKeys.all, 'slots'] }),
  });
}
