import type { SessionBody } from '../../shared/schemas/auth.schema';
import { useSession } from '../features/auth/api/get-session';

/**
 * The signed-in person, for pages under the signed-in layout. That layout's loader has loaded
 * the session and the layout renders no page without one, so null here is a wiring mistake.
 */
export function useCurrentSession(): SessionBody {
  const session = useSession();
  if (!session.data) throw new Error('useCurrentSession used outside the signed-in layout');
  return session.data;
}
