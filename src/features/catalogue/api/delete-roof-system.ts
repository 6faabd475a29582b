import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

/** Takes a roof system off the branch (204); estimates already made with it keep their figures. */
export function deleteRoofSystem(systemId: number) {
  return apiClient.delete(`/api/roof-systems/${systemId}`);
}

export function useDeleteRoofSystem() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: deleteRoofSystem, onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKeys.systems() }) });
}
