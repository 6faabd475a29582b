import type { OrganisationKind, Role } from '../../shared/domain/roles';

/** The signed-in person as every route sees it: who, which role, which organisation. */
export interface AuthUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  organisation: { id: number; name: string; kind: OrganisationKind };
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends AuthUser {}
  }
}

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
  }
}
