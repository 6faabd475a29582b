import { useMutation, useQueryClient } from '@tanstack/react-query';
import { merchantRoofSystemSchema } from '../../../../shared/schemas/price-list.schema';
import type { RoofSystemBody } from '../../../../shared/schemas/price-list.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

/** A new roof system at a branch; 422 names the component whose product is of the wrong kind. */
export function createRoofSystem(body: RoofSystemBody) {
  return apiClient.post('/api/roof-systems', { body, schema: merchantRoofSystemSchema });
}

export function useCreateRoofSystem() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: createRoofSystem, onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKeys.systems() }) });
}
