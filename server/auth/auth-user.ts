import type { OrganisationKind, Role } from '../../shared/domain/roles';

/** The signed-in person as every route sees it: who, which role, which organisation. */
export interface AuthUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  organisation: { id: number; name: string; kind: OrganisationKind };
}

/**
 * What the session's read found about whom it signs in: the user id in the session, the person
 * (null when they are no longer there) and their organisation's order-book version at that moment.
 */
export interface SignedInRead {
  id: number;
  user: AuthUser | null;
  bookVersion: number;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends AuthUser {}
    interface Request {
      /** Read with this request's session (session-store.ts); undefined when the session was read another way or signs nobody in. */
      signedIn?: SignedInRead;
    }
  }
}

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
  }
}
