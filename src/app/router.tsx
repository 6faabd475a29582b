import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter } from 'react-router-dom';
import type { RouteObject } from 'react-router-dom';
import { ROLES_BY_KIND } from '../../shared/domain/roles';
import { RootErrorPage, RouteErrorPage } from '../components/errors/route-error-page';
import { PageLoading } from '../components/ui/page-loading';
import { redirectIfSignedIn, requireAction, requireHomeOf, requireSession, rootRedirect } from './route-guards';
import { AccountsRoute } from './routes/accounts-route';
import { AcceptInvitationRoute } from './routes/accept-invitation-route';
import { AmendOrderRoute } from './routes/amend-order-route';
import { EstimateCaution, FaceDrawingCaution, NewEstimateCaution, OrderCaution, PlaceOrderCaution, YardLoadingCaution, YardPalletCaution } from './routes/cautions';
import { CompareEstimatesRoute } from './routes/compare-estimates-route';
import { EditSiteRoute } from './routes/edit-site-route';
import { EstimateRoute } from './routes/estimate-route';
import { FaceRoute } from './routes/face-route';
import { NewEstimateRoute } from './routes/new-estimate-route';
import { NewSiteRoute } from './routes/new-site-route';
import { OrderRoute } from './routes/order-route';
import { OrdersRoute } from './routes/orders-route';
import { PlaceOrderRoute } from './routes/place-order-route';
import { QuoteRequestRoute } from './routes/quote-request-route';
import { QuoteRoute } from './routes/quote-route';
import { QuotesRoute } from './routes/quotes-route';
import { guardedRoute } from './routes/route-loaders';
import { ScheduleEditRoute } from './routes/schedule-edit-route';
import { ScheduleImportRoute } from './routes/schedule-import-route';
import { ScheduleVersionRoute } from './routes/schedule-version-route';
import { SiteRoute } from './routes/site-route';
import { SitesRoute } from './routes/sites-route';
import { AppLayoutRoute } from './routes/app-layout-route';
import { BranchesRoute } from './routes/branches-route';
import { ContractorHomeRoute } from './routes/contractor-home-route';
import { DeskHomeRoute } from './routes/desk-home-route';
import { DeskOrderRoute } from './routes/desk-order-route';
import { DeskOrdersRoute } from './routes/desk-orders-route';
import { DeskQuoteRoute } from './routes/desk-quote-route';
import { DeskQuotesRoute } from './routes/desk-quotes-route';
import { CatalogueRoute } from './routes/catalogue-route';
import { InvoiceRoute } from './routes/invoice-route';
import { InvoicesRoute } from './routes/invoices-route';
import { DriverHomeRoute } from './routes/driver-home-route';
import { FleetRoute } from './routes/fleet-route';
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
import { YardOrderRoute } from './routes/yard-order-route';
import { YardPalletRoute } from './routes/yard-pallet-route';
import { YardRunRoute } from './routes/yard-run-route';

const pageError = <RouteErrorPage />;

/** The contractor workspace: sites and their schedules, estimates, orders and quote requests. */
function contractorRoutes(queryClient: QueryClient): RouteObject[] {
  const page = (path: string, action: Parameters<typeof guardedRoute>[1], element: RouteObject['element'], idParams: string[] = [], handle?: RouteObject['handle']): RouteObject => ({
    path,
    loader: guardedRoute(queryClient, action, ...idParams),
    element,
    errorElement: pageError,
    ...(handle ? { handle } : {}),
  });
  return [
    page('sites', 'projects:read', <SitesRoute />),
    page('sites/new', 'projects:write', <NewSiteRoute />),
    page('sites/:projectId', 'projects:read', <SiteRoute />, ['projectId']),
    page('sites/:projectId/edit', 'projects:write', <EditSiteRoute />, ['projectId']),
    page('sites/:projectId/schedule/import', 'projects:write', <ScheduleImportRoute />, ['projectId']),
    page('sites/:projectId/schedule/edit', 'projects:write', <ScheduleEditRoute />, ['projectId']),
    page('sites/:projectId/schedules/:version', 'projects:read', <ScheduleVersionRoute />, ['projectId', 'version']),
    page('sites/:projectId/estimates/new', 'estimates:write', <NewEstimateRoute />, ['projectId'], { caution: <NewEstimateCaution /> }),
    page('estimates/compare', 'estimates:read', <CompareEstimatesRoute />),
    page('estimates/:estimateId', 'estimates:read', <EstimateRoute />, ['estimateId'], { caution: <EstimateCaution /> }),
    page('estimates/:estimateId/faces/:faceIndex', 'estimates:read', <FaceRoute />, ['estimateId'], { caution: <FaceDrawingCaution /> }),
    page('estimates/:estimateId/order', 'orders:place', <PlaceOrderRoute />, ['estimateId'], { caution: <PlaceOrderCaution /> }),
    page('estimates/:estimateId/quote', 'orders:place', <QuoteRequestRoute />, ['estimateId'], { caution: <PlaceOrderCaution /> }),
    page('orders', 'orders:place', <OrdersRoute />),
    page('orders/:orderId', 'orders:place', <OrderRoute />, ['orderId'], { caution: <OrderCaution /> }),
    page('orders/:orderId/amend', 'orders:place', <AmendOrderRoute />, ['orderId'], { caution: <OrderCaution /> }),
    page('quotes', 'orders:place', <QuotesRoute />),
    page('quotes/:requestId', 'orders:place', <QuoteRoute />, ['requestId']),
  ];
}

/** The merchant's side: the order book and its orders. */
function merchantRoutes(queryClient: QueryClient): RouteObject[] {
  const page = (path: string, action: Parameters<typeof guardedRoute>[1], element: RouteObject['element'], idParams: string[] = [], handle?: RouteObject['handle']): RouteObject => ({
    path,
    loader: guardedRoute(queryClient, action, ...idParams),
    element,
    errorElement: pageError,
    ...(handle ? { handle } : {}),
  });
  return [
    page('desk/orders', 'orders:confirm', <DeskOrdersRoute />),
    page('desk/orders/:orderId', 'orders:confirm', <DeskOrderRoute />, ['orderId'], { caution: <OrderCaution /> }),
    page('desk/quotes', 'orders:confirm', <DeskQuotesRoute />),
    page('desk/quotes/:requestId', 'orders:confirm', <DeskQuoteRoute />, ['requestId']),
    page('fleet', 'fleet:manage', <FleetRoute />),
    // The yard's runs: the desk sees them too; what each role may change there follows the runs:* actions.
    page('yard/runs/:runId', 'runs:read', <YardRunRoute />, ['runId'], { caution: <YardLoadingCaution /> }),
    page('yard/pallets/:orderId/:pallet', 'runs:read', <YardPalletRoute />, ['orderId', 'pallet'], { caution: <YardPalletCaution /> }),
    page('yard/orders/:orderId', 'slots:read', <YardOrderRoute />, ['orderId'], { caution: <OrderCaution /> }),
    page('catalogue', 'catalogue:read', <CatalogueRoute />),
    // Both sides: the desk issues and credits, the contractor pays (the card page sends it back here).
    page('invoices', 'invoices:read', <InvoicesRoute />),
    page('invoices/:invoiceId', 'invoices:read', <InvoiceRoute />, ['invoiceId']),
    page('accounts', 'accounts:manage', <AccountsRoute />),
  ];
}

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
              // The dispatcher's home; the merchant owner reaches the same day plan from the navigation.
              path: 'yard',
              loader: requireHomeOf(queryClient, ['merchant_dispatcher', 'merchant_owner']),
              element: <YardHomeRoute />,
              handle: { caution: <YardLoadingCaution /> },
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
            ...contractorRoutes(queryClient),
            ...merchantRoutes(queryClient),
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
