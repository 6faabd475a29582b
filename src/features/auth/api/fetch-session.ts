import { sessionAnswerSchema } from '../../../../shared/schemas/auth.schema';
import type { SessionBody } from '../../../../shared/schemas/auth.schema';
import { apiClient } from '../../../lib/api-client';
import { adoptSessionSettings } from './adopt-session';

/**
 * Who is signed in, or null when nobody is. The server answers 200 either way, so a signed-out page
 * makes no failed request (and the browser logs no error) just to learn that nobody is signed in.
 * Apart from the query (get-session.ts) so the sign-in page asks without the query library.
 */
export async function fetchSession(signal?: AbortSignal): Promise<SessionBody | null> {
  const answer = await apiClient.get('/api/auth/session', { schema: sessionAnswerSchema, signal, redirectOnUnauthenticated: false });
  adoptSessionSettings(answer.session);
  return answer.session;
}
