import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { merchantRoofSystemSchema } from '../../../../shared/schemas/price-list.schema';
import type { updateRoofSystemBodySchema } from '../../../../shared/schemas/price-list.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

export type UpdateRoofSystemBody = z.input<typeof updateRoofSystemBodySchema>;

export function updateRoofSystem(systemId: number, body: UpdateRoofSystemBody) {
  return apiClient.patch(`/api/roof-systems/${systemId}`, { body, schema: merchantRoofSystemSchema });
}

/** Changes a roof system's name, description or products; the settings are kept unless sent. */
export function useUpdateRoofSystem(systemId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateRoofSystemBody) => updateRoofSystem(systemId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKeys.systems() }),
  });
}
