import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { sessionBodySchema } from '../../../../shared/schemas/auth.schema';
import type { acceptInvitationBodySchema, SessionBody } from '../../../../shared/schemas/auth.schema';
import { apiClient } from '../../../lib/api-client';
import { rememberSession } from './get-session';

export type AcceptInvitationBody = z.infer<typeof acceptInvitationBodySchema>;

export function acceptInvitation(token: string, body: AcceptInvitationBody): Promise<SessionBody> {
  return apiClient.post(`/api/invitations/${encodeURIComponent(token)}/accept`, {
    body,
    schema: sessionBodySchema,
    redirectOnUnauthenticated: false,
    rotatesSession: true,
  });
}

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AcceptInvitationBody) => acceptInvitation(token, body),
    onSuccess: (session) => rememberSession(queryClient, session),
  });
}
