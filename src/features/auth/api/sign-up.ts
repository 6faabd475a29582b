import { useMutation, useQueryClient } from '@tanstack/react-query';
import { sessionBodySchema } from '../../../../shared/schemas/auth.schema';
import type { SessionBody, SignupBody } from '../../../../shared/schemas/auth.schema';
import { apiClient } from '../../../lib/api-client';
import { rememberSession } from './get-session';

export function signUp(body: SignupBody): Promise<SessionBody> {
  return apiClient.post('/api/auth/signup', {
    body,
    schema: sessionBodySchema,
    redirectOnUnauthenticated: false,
    rotatesSession: true,
  });
}

export function useSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signUp,
    onSuccess: (session) => rememberSession(queryClient, session),
  });
}
