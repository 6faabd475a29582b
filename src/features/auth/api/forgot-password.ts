import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { okBodySchema } from '../../../../shared/schemas/auth.schema';
import type { forgotPasswordBodySchema } from '../../../../shared/schemas/auth.schema';
import { apiClient } from '../../../lib/api-client';

export type ForgotPasswordBody = z.infer<typeof forgotPasswordBodySchema>;

export function requestPasswordReset(body: ForgotPasswordBody): Promise<{ ok: true }> {
  return apiClient.post('/api/auth/password/forgot', { body, schema: okBodySchema, redirectOnUnauthenticated: false });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
