import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient, isApiError } from '../../../lib/api-client';
import { authKeys } from './keys';

export async function signOut(): Promise<void> {
  try {
    await apiClient.post('/api/auth/logout', { rotatesSession: true, redirectOnUnauthenticated: false });
  } catch (error) {
    // A session that has already ended is the outcome asked for.
    if (isApiError(error) && error.status === 401) return;
    throw error;
  }
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => {
      // Forget everything this person saw in this tab.
      queryClient.removeQueries();
      queryClient.setQueryData(authKeys.session(), null);
    },
  });
}
