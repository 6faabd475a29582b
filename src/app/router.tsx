import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter } from 'react-router-dom';
import type { RouteObject } from 'react-router-dom';
import { ROLES_BY_KIND } from '../../shared/domain/roles';
import { RootErrorPage, RouteErrorPage } from '../components/errors/route-error-page';
import { PageLoading } from '../components/ui/page-loading';
import { redirectIfSignedIn, requireAction, requireHomeOf, requireSession, rootRedirect } from './route-guards';
import { AcceptInvitationRoute } from './routes/accept-invitation-route';
import { AppLayoutRoute } from './routes/app-layout-route';
import { BranchesRoute } from './routes/branches-route';
import { ContractorHomeRoute } from './routes/contractor-home-route';
import { DeskHomeRoute } from './routes/desk-home-route';
import { DriverHomeRoute } from './routes/driver-home-route';
import { ForgotPasswordRoute } from './routes/forgot-password-route';
import { NotFoundRoute } from './routes/not-found-route';
import { OrganisationRoute } from './routes/organisation-route';
import { OutboxRoute } from './routes/outbox-route';
import { PublicFrame } from './routes/public-frame';
import { ResetPasswordRoute } from './routes/reset-password-route';
import { RootLayout } from './routes/root-layout';
import { SignInRoute } from './routes/sign-in-route';
import { SignUpRoute } from './routes/sign-up-route';
import { TeamRoute } from './routes/team-route';
import { YardHomeRoute } from './routes/yard-home-route';

const pageError = <RouteErrorPage />;

/** Every route of the client. Loaders only guard; pages fetch their own data and show its states. */
export function appRoutes(queryClient: QueryClient): RouteObject[] {
  return [
    {
      element: <RootLayout />,
      errorElement: <RootErrorPage />,
      hydrateFallbackElement: <PageLoading />,
      children: [
        { index: true, loader: rootRedirect(queryClient), errorElement: <RootErrorPage /> },
        {
          element: <PublicFrame />,
          errorElement: <RootErrorPage />,
          children: [
            {
              loader: redirectIfSignedIn(queryClient),
              errorElement: pageError,
              children: [
                { path: 'sign-in', element: <SignInRoute />, errorElement: pageError },
                { path: 'sign-up', element: <SignUpRoute />, errorElement: pageError },
                { path: 'forgot-password', element: <ForgotPasswordRoute />, errorElement: pageError },
              ],
            },
            { path: 'reset-password', element: <ResetPasswordRoute />, errorElement: pageError },
            { path: 'invitations/:token', element: <AcceptInvitationRoute />, errorElement: pageError },
          ],
        },
        { path: 'outbox/:messageId?', element: <OutboxRoute />, errorElement: <RootErrorPage /> },
        {
          element: <AppLayoutRoute />,
          loader: requireSession(queryClient),
          errorElement: <RootErrorPage />,
          children: [
            {
              path: 'contractor',
              loader: requireHomeOf(queryClient, ROLES_BY_KIND.contractor),
              element: <ContractorHomeRoute />,
              errorElement: pageError,
            },
            {
              path: 'desk',
              loader: requireHomeOf(queryClient, ['merchant_owner', 'merchant_sales']),
              element: <DeskHomeRoute />,
              errorElement: pageError,
            },
            {
              path: 'yard',
              loader: requireHomeOf(queryClient, ['merchant_dispatcher']),
              element: <YardHomeRoute />,
              errorElement: pageError,
            },
            {
              path: 'driver',
              loader: requireHomeOf(queryClient, ['driver']),
              element: <DriverHomeRoute />,
              errorElement: pageError,
            },
            { path: 'team', loader: requireAction(queryClient, 'members:read'), element: <TeamRoute />, errorElement: pageError },
            {
              path: 'branches',
              loader: requireAction(queryClient, 'branches:read'),
              element: <BranchesRoute />,
              errorElement: pageError,
            },
            {
              path: 'organisation',
              loader: requireAction(queryClient, 'organisation:read'),
              element: <OrganisationRoute />,
              errorElement: pageError,
            },
          ],
        },
        { path: '*', element: <NotFoundRoute /> },
      ],
    },
  ];
}

export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter(appRoutes(queryClient));
}

export type AppRouter = ReturnType<typeof createAppRouter>;
