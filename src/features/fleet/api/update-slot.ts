import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { slotSchema } from '../../../../shared/schemas/slot.schema';
import type { updateSlotBodySchema } from '../../../../shared/schemas/slot.schema';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

export type UpdateSlotBody = z.input<typeof updateSlotBodySchema>;

/**
 * Changes a slot's time window or driver (null takes the driver off). A window the lorry already
 * has that day is refused with 409 slot_exists; a driver who is not the merchant's with 422.
 */
export function updateSlot(slotId: number, body: UpdateSlotBody) {
  return apiClient.patch(`/api/slots/${slotId}`, { body, schema: slotSchema });
}

export function useUpdateSlot() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ slotId, body }: { slotId: number; body: UpdateSlotBody }) => updateSlot(slotId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: [...fleetKeys.all, 'slots'] }),
  });
}
