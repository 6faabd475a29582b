import type { ComponentType } from 'react';
import type { RouteHandle } from '../components/layout/caution-slot';

/**
 * What a page's code gives the router once loaded: the page, and the caution it shows above itself.
 * The caution travels with the page because its words (and the estimate or order it reads) are only
 * needed there.
 */
export interface PageModule {
  Component: ComponentType;
  handle?: RouteHandle;
}

export type PageLoader = () => Promise<PageModule>;

const loadCautions = () => import('./routes/cautions');

function withCaution<M>(load: () => Promise<M>, pick: (m: M) => ComponentType, caution: (c: Awaited<ReturnType<typeof loadCautions>>) => ComponentType): PageLoader {
  return async () => {
    const [m, c] = await Promise.all([load(), loadCautions()]);
    const Caution = caution(c);
    return { Component: pick(m), handle: { caution: <Caution /> } };
  };
}

function plain<M>(load: () => Promise<M>, pick: (m: M) => ComponentType): PageLoader {
  return async () => ({ Component: pick(await load()) });
}

/**
 * Every page, each fetched the first time it is visited (or when its navigation link is pointed at):
 * a change to one feature leaves the others' files, and the browser's copies of them, as they were.
 * The signed-in frame is in the app's first script; the sign-in page is also shown on its own before
 * the app loads (src/app/sign-in-start.tsx).
 */
export const PAGES = {
  signIn: plain(
    () => import('./routes/sign-in-route'),
    (m) => m.SignInRoute,
  ),
  signUp: plain(
    () => import('./routes/sign-up-route'),
    (m) => m.SignUpRoute,
  ),
  forgotPassword: plain(
    () => import('./routes/forgot-password-route'),
    (m) => m.ForgotPasswordRoute,
  ),
  resetPassword: plain(
    () => import('./routes/reset-password-route'),
    (m) => m.ResetPasswordRoute,
  ),
  acceptInvitation: plain(
    () => import('./routes/accept-invitation-route'),
    (m) => m.AcceptInvitationRoute,
  ),
  outbox: plain(
    () => import('./routes/outbox-route'),
    (m) => m.OutboxRoute,
  ),
  notFound: plain(
    () => import('./routes/not-found-route'),
    (m) => m.NotFoundRoute,
  ),

  contractorHome: plain(
    () => import('./routes/contractor-home-route'),
    (m) => m.ContractorHomeRoute,
  ),
  deskHome: plain(
    () => import('./routes/desk-home-route'),
    (m) => m.DeskHomeRoute,
  ),
  yardHome: withCaution(
    () => import('./routes/yard-home-route'),
    (m) => m.YardHomeRoute,
    (c) => c.YardLoadingCaution,
  ),
  driverHome: plain(
    () => import('./routes/driver-home-route'),
    (m) => m.DriverHomeRoute,
  ),
  team: plain(
    () => import('./routes/team-route'),
    (m) => m.TeamRoute,
  ),
  branches: plain(
    () => import('./routes/branches-route'),
    (m) => m.BranchesRoute,
  ),
  organisation: plain(
    () => import('./routes/organisation-route'),
    (m) => m.OrganisationRoute,
  ),

  sites: plain(
    () => import('./routes/sites-route'),
    (m) => m.SitesRoute,
  ),
  newSite: plain(
    () => import('./routes/new-site-route'),
    (m) => m.NewSiteRoute,
  ),
  site: plain(
    () => import('./routes/site-route'),
    (m) => m.SiteRoute,
  ),
  editSite: plain(
    () => import('./routes/edit-site-route'),
    (m) => m.EditSiteRoute,
  ),
  scheduleImport: plain(
    () => import('./routes/schedule-import-route'),
    (m) => m.ScheduleImportRoute,
  ),
  scheduleEdit: plain(
    () => import('./routes/schedule-edit-route'),
    (m) => m.ScheduleEditRoute,
  ),
  scheduleVersion: plain(
    () => import('./routes/schedule-version-route'),
    (m) => m.ScheduleVersionRoute,
  ),
  newEstimate: withCaution(
    () => import('./routes/new-estimate-route'),
    (m) => m.NewEstimateRoute,
    (c) => c.NewEstimateCaution,
  ),
  compareEstimates: plain(
    () => import('./routes/compare-estimates-route'),
    (m) => m.CompareEstimatesRoute,
  ),
  estimate: withCaution(
    () => import('./routes/estimate-route'),
    (m) => m.EstimateRoute,
    (c) => c.EstimateCaution,
  ),
  face: withCaution(
    () => import('./routes/face-route'),
    (m) => m.FaceRoute,
    (c) => c.FaceDrawingCaution,
  ),
  placeOrder: withCaution(
    () => import('./routes/place-order-route'),
    (m) => m.PlaceOrderRoute,
    (c) => c.PlaceOrderCaution,
  ),
  quoteRequest: withCaution(
    () => import('./routes/quote-request-route'),
    (m) => m.QuoteRequestRoute,
    (c) => c.PlaceOrderCaution,
  ),
  orders: plain(
    () => import('./routes/orders-route'),
    (m) => m.OrdersRoute,
  ),
  order: withCaution(
    () => import('./routes/order-route'),
    (m) => m.OrderRoute,
    (c) => c.OrderCaution,
  ),
  amendOrder: withCaution(
    () => import('./routes/amend-order-route'),
    (m) => m.AmendOrderRoute,
    (c) => c.OrderCaution,
  ),
  quotes: plain(
    () => import('./routes/quotes-route'),
    (m) => m.QuotesRoute,
  ),
  quote: plain(
    () => import('./routes/quote-route'),
    (m) => m.QuoteRoute,
  ),

  deskOrders: plain(
    () => import('./routes/desk-orders-route'),
    (m) => m.DeskOrdersRoute,
  ),
  deskOrder: withCaution(
    () => import('./routes/desk-order-route'),
    (m) => m.DeskOrderRoute,
    (c) => c.OrderCaution,
  ),
  deskQuotes: plain(
    () => import('./routes/desk-quotes-route'),
    (m) => m.DeskQuotesRoute,
  ),
  deskQuote: plain(
    () => import('./routes/desk-quote-route'),
    (m) => m.DeskQuoteRoute,
  ),
  fleet: plain(
    () => import('./routes/fleet-route'),
    (m) => m.FleetRoute,
  ),
  yardRun: withCaution(
    () => import('./routes/yard-run-route'),
    (m) => m.YardRunRoute,
    (c) => c.YardLoadingCaution,
  ),
  yardPallet: withCaution(
    () => import('./routes/yard-pallet-route'),
    (m) => m.YardPalletRoute,
    (c) => c.YardPalletCaution,
  ),
  yardOrder: withCaution(
    () => import('./routes/yard-order-route'),
    (m) => m.YardOrderRoute,
    (c) => c.OrderCaution,
  ),
  catalogue: plain(
    () => import('./routes/catalogue-route'),
    (m) => m.CatalogueRoute,
  ),
  invoices: plain(
    () => import('./routes/invoices-route'),
    (m) => m.InvoicesRoute,
  ),
  invoice: plain(
    () => import('./routes/invoice-route'),
    (m) => m.InvoiceRoute,
  ),
  accounts: plain(
    () => import('./routes/accounts-route'),
    (m) => m.AccountsRoute,
  ),
} satisfies Record<string, PageLoader>;

/** The page behind each navigation address (a role's home and each section). */
const PAGE_AT: Readonly<Record<string, PageLoader>> = {
  '/contractor': PAGES.contractorHome,
  '/desk': PAGES.deskHome,
  '/yard': PAGES.yardHome,
  '/driver': PAGES.driverHome,
  '/team': PAGES.team,
  '/branches': PAGES.branches,
  '/organisation': PAGES.organisation,
  '/sites': PAGES.sites,
  '/orders': PAGES.orders,
  '/quotes': PAGES.quotes,
  '/desk/orders': PAGES.deskOrders,
  '/desk/quotes': PAGES.deskQuotes,
  '/fleet': PAGES.fleet,
  '/catalogue': PAGES.catalogue,
  '/invoices': PAGES.invoices,
  '/accounts': PAGES.accounts,
};

/**
 * Starts fetching the code of the page at a navigation address, so that a click after a hover or a
 * focus finds it loaded. Loading twice costs nothing (the browser keeps one copy of each module); a
 * failed fetch is left for the navigation itself to report.
 */
export function prefetchPage(path: string): void {
  const load = PAGE_AT[path];
  if (load) void load().catch(() => undefined);
}

/** Whether a navigation address has a page whose code can be fetched ahead. */
export function hasPrefetch(path: string): boolean {
  return path in PAGE_AT;
}
