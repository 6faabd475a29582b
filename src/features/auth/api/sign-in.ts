import { sessionBodySchema } from '../../../../shared/schemas/auth.schema';
import type { LoginBody, SessionBody } from '../../../../shared/schemas/auth.schema';
import { apiClient } from '../../../lib/api-client';

/**
 * Signs in and answers the new session. A plain call rather than a mutation hook: the sign-in page
 * shows before the query library has loaded; whoever shows the next page keeps the session
 * (`rememberSession`).
 */
export function signIn(body: LoginBody): Promise<SessionBody> {
  return apiClient.post('/api/auth/login', {
    body,
    schema: sessionBodySchema,
    redirectOnUnauthenticated: false,
    rotatesSession: true,
  });
}
