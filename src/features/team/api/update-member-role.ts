import { useMutation, useQueryClient } from '@tanstack/react-query';
import { memberSchema } from '../../../../shared/schemas/members.schema';
import type { Role } from '../../../../shared/domain/roles';
import { apiClient } from '../../../lib/api-client';
import { memberKeys } from './keys';

export function updateMemberRole(id: number, role: Role) {
  return apiClient.patch(`/api/members/${id}`, { body: { role }, schema: memberSchema });
}

export function useUpdateMemberRole() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, role }: { id: number; role: Role }) => updateMemberRole(id, role),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: memberKeys.all }),
  });
}
