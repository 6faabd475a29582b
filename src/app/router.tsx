import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter } from 'react-router-dom';
import type { RouteObject } from 'react-router-dom';
import { ROLES_BY_KIND } from '../../shared/domain/roles';
import { RootErrorPage, RouteErrorPage } from '../components/errors/route-error-page';
import { PageLoading } from '../components/ui/page-loading';
import { PAGES } from './lazy-pages';
import type { PageLoader } from './lazy-pages';
import { redirectIfSignedIn, requireAction, requireHomeOf, requireSession, rootRedirect } from './route-guards';
import { guardedRoute } from './routes/route-loaders';
import { AppLayoutRoute } from './routes/app-layout-route';
import { PublicFrame } from './routes/public-frame';
import { RootLayout } from './routes/root-layout';

const pageError = <RouteErrorPage />;

/** The contractor workspace: sites and their schedules, estimates, orders and quote requests. */
function contractorRoutes(queryClient: QueryClient): RouteObject[] {
  const page = guardedPage(queryClient);
  return [
    page('sites', 'projects:read', PAGES.sites),
    page('sites/new', 'projects:write', PAGES.newSite),
    page('sites/:projectId', 'projects:read', PAGES.site, ['projectId']),
    page('sites/:projectId/edit', 'projects:write', PAGES.editSite, ['projectId']),
    page('sites/:projectId/schedule/import', 'projects:write', PAGES.scheduleImport, ['projectId']),
    page('sites/:projectId/schedule/edit', 'projects:write', PAGES.scheduleEdit, ['projectId']),
    page('sites/:projectId/schedules/:version', 'projects:read', PAGES.scheduleVersion, ['projectId', 'version']),
    page('sites/:projectId/estimates/new', 'estimates:write', PAGES.newEstimate, ['projectId']),
    page('estimates/compare', 'estimates:read', PAGES.compareEstimates),
    page('estimates/:estimateId', 'estimates:read', PAGES.estimate, ['estimateId']),
    page('estimates/:estimateId/faces/:faceIndex', 'estimates:read', PAGES.face, ['estimateId']),
    page('estimates/:estimateId/order', 'orders:place', PAGES.placeOrder, ['estimateId']),
    page('estimates/:estimateId/quote', 'orders:place', PAGES.quoteRequest, ['estimateId']),
    page('orders', 'orders:place', PAGES.orders),
    page('orders/:orderId', 'orders:place', PAGES.order, ['orderId']),
    page('orders/:orderId/amend', 'orders:place', PAGES.amendOrder, ['orderId']),
    page('quotes', 'orders:place', PAGES.quotes),
    page('quotes/:requestId', 'orders:place', PAGES.quote, ['requestId']),
  ];
}

/** The merchant's side: the order book and its orders. */
function merchantRoutes(queryClient: QueryClient): RouteObject[] {
  const page = guardedPage(queryClient);
  return [
    page('desk/orders', 'orders:confirm', PAGES.deskOrders),
    page('desk/orders/:orderId', 'orders:confirm', PAGES.deskOrder, ['orderId']),
    page('desk/quotes', 'orders:confirm', PAGES.deskQuotes),
    page('desk/quotes/:requestId', 'orders:confirm', PAGES.deskQuote, ['requestId']),
    page('fleet', 'fleet:manage', PAGES.fleet),
    // The yard's runs: the desk sees them too; what each role may change there follows the runs:* actions.
    page('yard/runs/:runId', 'runs:read', PAGES.yardRun, ['runId']),
    page('yard/pallets/:orderId/:pallet', 'runs:read', PAGES.yardPallet, ['orderId', 'pallet']),
    page('yard/orders/:orderId', 'slots:read', PAGES.yardOrder, ['orderId']),
    page('catalogue', 'catalogue:read', PAGES.catalogue),
    // Both sides: the desk issues and credits, the contractor pays (the card page sends it back here).
    page('invoices', 'invoices:read', PAGES.invoices),
    page('invoices/:invoiceId', 'invoices:read', PAGES.invoice, ['invoiceId']),
    page('accounts', 'accounts:manage', PAGES.accounts),
  ];
}

/** A page behind a policy action, its code loaded on first visit while its guard runs. */
function guardedPage(queryClient: QueryClient) {
  return (path: string, action: Parameters<typeof guardedRoute>[1], lazy: PageLoader, idParams: string[] = []): RouteObject => ({
    path,
    loader: guardedRoute(queryClient, action, ...idParams),
    lazy,
    errorElement: pageError,
  });
}

/**
 * Every route of the client. Loaders only guard; pages fetch their own data and show its states. The
 * signed-in frame comes with the app's first script (src/app/app-start.tsx); every page is fetched as
 * it is needed, at the same time as its guard runs (src/app/lazy-pages.tsx). The sign-in page opened
 * first shows without the router (src/app/sign-in-start.tsx).
 */
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
                { path: 'sign-in', lazy: PAGES.signIn, errorElement: pageError },
                { path: 'sign-up', lazy: PAGES.signUp, errorElement: pageError },
                { path: 'forgot-password', lazy: PAGES.forgotPassword, errorElement: pageError },
              ],
            },
            { path: 'reset-password', lazy: PAGES.resetPassword, errorElement: pageError },
            { path: 'invitations/:token', lazy: PAGES.acceptInvitation, errorElement: pageError },
          ],
        },
        { path: 'outbox/:messageId?', lazy: PAGES.outbox, errorElement: <RootErrorPage /> },
        {
          element: <AppLayoutRoute />,
          loader: requireSession(queryClient),
          errorElement: <RootErrorPage />,
          children: [
            {
              path: 'contractor',
              loader: requireHomeOf(queryClient, ROLES_BY_KIND.contractor),
              lazy: PAGES.contractorHome,
              errorElement: pageError,
            },
            {
              path: 'desk',
              loader: requireHomeOf(queryClient, ['merchant_owner', 'merchant_sales']),
              lazy: PAGES.deskHome,
              errorElement: pageError,
            },
            {
              // The dispatcher's home; the merchant owner reaches the same day plan from the navigation.
              path: 'yard',
              loader: requireHomeOf(queryClient, ['merchant_dispatcher', 'merchant_owner']),
              lazy: PAGES.yardHome,
              errorElement: pageError,
            },
            {
              path: 'driver',
              loader: requireHomeOf(queryClient, ['driver']),
              lazy: PAGES.driverHome,
              errorElement: pageError,
            },
            { path: 'team', loader: requireAction(queryClient, 'members:read'), lazy: PAGES.team, errorElement: pageError },
            {
              path: 'branches',
              loader: requireAction(queryClient, 'branches:read'),
              lazy: PAGES.branches,
              errorElement: pageError,
            },
            {
              path: 'organisation',
              loader: requireAction(queryClient, 'organisation:read'),
              lazy: PAGES.organisation,
              errorElement: pageError,
            },
            ...contractorRoutes(queryClient),
            ...merchantRoutes(queryClient),
          ],
        },
        { path: '*', lazy: PAGES.notFound },
      ],
    },
  ];
}

export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter(appRoutes(queryClient));
}

export type AppRouter = ReturnType<typeof createAppRouter>;
