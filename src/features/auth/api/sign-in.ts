import { useMutation, useQueryClient } from '@tanstack/react-query';
import { sessionBodySchema } from '../../../../shared/schemas/auth.schema';
import type { LoginBody, SessionBody } from '../../../../shared/schemas/auth.schema';
import { apiClient } from '../../../lib/api-client';
import { startSession } from './adopt-session';

export function signIn(body: LoginBody): Promise<SessionBody> {
  return apiClient.post('/api/auth/login', {
    body,
    schema: sessionBodySchema,
    redirectOnUnauthenticated: false,
    rotatesSession: true,
  });
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (session) => startSession(queryClient, session),
  });
}
