import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { okBodySchema } from '../../../../shared/schemas/auth.schema';
import type { resetPasswordBodySchema } from '../../../../shared/schemas/auth.schema';
import { apiClient } from '../../../lib/api-client';

export type ResetPasswordBody = z.infer<typeof resetPasswordBodySchema>;

export function resetPassword(body: ResetPasswordBody): Promise<{ ok: true }> {
  return apiClient.post('/api/auth/password/reset', { body, schema: okBodySchema, redirectOnUnauthenticated: false });
}

export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword });
}
