import { useMutation, useQueryClient } from '@tanstack/react-query';
import { sessionBodySchema } from '../../../../shared/schemas/auth.schema';
import type { LoginBody, SessionBody } from '../../../../shared/schemas/auth.schema';
import { apiClient } from '../../../lib/api-client';
import { authKeys } from './keys';

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
    onSuccess: (session) => {
      // Nothing cached for a previous person may leak into this one's pages.
      queryClient.removeQueries();
      queryClient.setQueryData(authKeys.session(), session);
    },
  });
}
