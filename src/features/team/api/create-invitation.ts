import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { invitationSchema } from '../../../../shared/schemas/members.schema';
import type { createInvitationBodySchema } from '../../../../shared/schemas/members.schema';
import { apiClient } from '../../../lib/api-client';
import { invitationKeys } from './keys';

export type CreateInvitationBody = z.infer<typeof createInvitationBodySchema>;

export function createInvitation(body: CreateInvitationBody) {
  return apiClient.post('/api/invitations', { body, schema: invitationSchema });
}

export function useCreateInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationKeys.all }),
  });
}
