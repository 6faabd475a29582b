import type { QueryClient } from '@tanstack/react-query';
import { data, redirect } from 'react-router-dom';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { can } from '../../shared/domain/policy';
import type { Action } from '../../shared/domain/policy';
import type { Role } from '../../shared/domain/roles';
import type { SessionBody } from '../../shared/schemas/auth.schema';
import { sessionQueryOptions } from '../features/auth/api/get-session';
import { signInPathWithNext } from '../lib/api-client';
import { homePathForRole, safeNextPath } from './home-path';

function pathOf(request: Request): string {
  const url = new URL(request.url);
  return `${url.pathname}${url.search}`;
}

async function sessionOrSignIn(queryClient: QueryClient, request: Request): Promise<SessionBody> {
  const session = await queryClient.ensureQueryData(sessionQueryOptions());
  if (!session) throw redirect(signInPathWithNext(pathOf(request)));
  return session;
}

/** Every page behind sign-in: nobody signed in goes to /sign-in?next=<here>. */
export function requireSession(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    await sessionOrSignIn(queryClient, request);
    return null;
  };
}

/** A role home: anyone else is sent on to their own home. */
export function requireHomeOf(queryClient: QueryClient, roles: readonly Role[]) {
  return async ({ request }: LoaderFunctionArgs) => {
    const session = await sessionOrSignIn(queryClient, request);
    if (!roles.includes(session.user.role)) throw redirect(homePathForRole(session.user.role));
    return null;
  };
}

/** A page that needs a policy action: other roles get a 403 page. */
export function requireAction(queryClient: QueryClient, action: Action) {
  return async ({ request }: LoaderFunctionArgs) => {
    const session = await sessionOrSignIn(queryClient, request);
    if (!can(session.user.role, action)) throw data('This page is not part of your role.', { status: 403 });
    return null;
  };
}

/** Sign-in and sign-up pages: someone already signed in goes on to where they were heading. */
export function redirectIfSignedIn(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const session = await queryClient.ensureQueryData(sessionQueryOptions());
    if (session) {
      const next = safeNextPath(new URL(request.url).searchParams.get('next'));
      throw redirect(next ?? homePathForRole(session.user.role));
    }
    return null;
  };
}

/** The bare address: home when signed in, sign-in otherwise. */
export function rootRedirect(queryClient: QueryClient) {
  return async () => {
    const session = await queryClient.ensureQueryData(sessionQueryOptions());
    throw redirect(session ? homePathForRole(session.user.role) : '/sign-in');
  };
}
