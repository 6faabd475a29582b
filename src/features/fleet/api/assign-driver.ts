import { useMutation, useQueryClient } from '@tanstack/react-query';
import { slotSchema } from '../../../../shared/schemas/slot.schema';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

/** The dispatcher puts a driver on a slot (null takes the driver off). */
export function assignDriver(slotId: number, driverId: number | null) {
  return apiClient.patch(`/api/slots/${slotId}`, { body: { driver_id: driverId }, schema: slotSchema });
}

export function useAssignDriver() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ slotId, driverId }: { slotId: number; driverId: number | null }) => assignDriver(slotId, driverId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: [...fleetKeys.all, 'slots'] }),
  });
}
