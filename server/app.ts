import { existsSync } from 'node:fs';
import { join } from 'node:path';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { clientAssets } from './http/client-assets';
import { CLIENT_DIR } from './paths';
import type { AppDeps } from './app-deps';
import { csrfProtection } from './auth/csrf';
import { sessions } from './auth/sessions';
import { SessionStore } from './auth/session-store';
import { loadSignedIn } from './auth/signed-in';
import { fixedHeaders } from './http/fixed-headers';
import { apiModules } from './http/endpoint';
import { apiNotFound, errorHandler } from './http/error-handler';
import { fromLoopback } from './http/loopback';
import { idempotency } from './http/idempotency';
import { businessDay } from './http/query-cache';
import { requestLog } from './http/request-log';
import { authRoutes } from './modules/auth/auth.routes';
import { authService } from './modules/auth/auth.service';
import { catalogueRoutes } from './modules/catalogue/catalogue.routes';
import { catalogueService } from './modules/catalogue/catalogue.service';
import { deliveriesRoutes } from './modules/deliveries/deliveries.routes';
import { deliveriesService } from './modules/deliveries/deliveries.service';
import { estimatesRoutes } from './modules/estimates/estimates.routes';
import { estimatesService } from './modules/estimates/estimates.service';
import { exportsRoutes } from './modules/exports/exports.routes';
import { healthRoutes } from './modules/health/health.routes';
import { membersRoutes } from './modules/members/members.routes';
import { membersService } from './modules/members/members.service';
import { usersRepository } from './modules/members/users.repository';
import { organisationsRoutes } from './modules/organisations/organisations.routes';
import { ordersRoutes } from './modules/orders/orders.routes';
import { ordersService } from './modules/orders/orders.service';
import { outboxRoutes } from './modules/outbox/outbox.routes';
import { fleetRoutes } from './modules/fleet/fleet.routes';
import { fleetService } from './modules/fleet/fleet.service';
import { invoicesRoutes } from './modules/invoices/invoices.routes';
import { invoicesService } from './modules/invoices/invoices.service';
import { paymentWebhookRoutes, paymentsRoutes } from './modules/payments/payments.routes';
import { paymentsService } from './modules/payments/payments.service';
import { priceListRoutes } from './modules/price-list/price-list.routes';
import { priceListService } from './modules/price-list/price-list.service';
import { slotsRoutes } from './modules/slots/slots.routes';
import { slotsService } from './modules/slots/slots.service';
import { stockRoutes } from './modules/stock/stock.routes';
import { stockService } from './modules/stock/stock.service';
import { createStripeClient } from './payments/stripe-client';
import { projectsRoutes } from './modules/projects/projects.routes';
import { projectsService } from './modules/projects/projects.service';
import { quotesRoutes } from './modules/quotes/quotes.routes';
import { quotesService } from './modules/quotes/quotes.service';
import { runsRoutes } from './modules/runs/runs.routes';
import { runsService } from './modules/runs/runs.service';
import { schedulesRoutes } from './modules/schedules/schedules.routes';
import { schedulesService } from './modules/schedules/schedules.service';

const SESSION_DAYS = 7;

/** The whole HTTP application, without listening, so tests run it in-process. */
export function createApp(deps: AppDeps): Express {
  const { config, db, logger } = deps;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.isProduction ? 1 : false);

  // helmet's headers have no per-request part here: worked out once (fixed-headers.ts).
  app.use(
    fixedHeaders(
      helmet({
        contentSecurityPolicy: {
          directives: {
            'default-src': ["'self'"],
            'img-src': ["'self'", 'data:', 'blob:'],
            'style-src': ["'self'", "'unsafe-inline'"],
            'font-src': ["'self'", 'data:'],
            'worker-src': ["'self'", 'blob:'],
            'frame-src': ["'self'"],
            'upgrade-insecure-requests': config.isProduction ? [] : null,
          },
        },
      }),
    ),
  );
  app.use(requestLog(logger, (url) => url === '/api/health'));

  const auth = authService(deps);
  const members = membersService(deps);
  const users = usersRepository(db);

  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email' }, (email, password, done) => {
      auth.verifyCredentials(email, password).then((u) => done(null, u ?? false), done);
    }),
  );
  // Passport signs people in and out (req.logIn, req.logOut); loadSignedIn reads who is signed in.
  passport.serializeUser((user, done) => done(null, user.id));

  const sessionStore = new SessionStore(db);
  const payments = paymentsService(deps, createStripeClient(config.stripe));
  const api = express.Router();
  // The payment provider's signed events need the raw body and carry no session or CSRF token.
  api.use(paymentWebhookRoutes(payments));
  // A request with no body (every GET) passes the JSON parser without its checks (no body: as type-is's hasBody).
  const json = express.json({ limit: '1mb' });
  api.use((req, res, next) => {
    if (req.headers['transfer-encoding'] === undefined && req.headers['content-length'] === undefined) {
      if (!Object.hasOwn(req, 'body')) req.body = undefined;
      return next();
    }
    json(req, res, next);
  });
  // Sessions in the database behind a signed cookie whose expiry rolls (sessions.ts).
  api.use(sessions(sessionStore, { secret: config.sessionSecret, maxAgeMs: SESSION_DAYS * 24 * 3_600_000, cookie: { httpOnly: true, sameSite: 'lax', secure: config.isProduction } }));
  // Passport's req.logIn / req.logOut through this app's request prototype, set up once:
  // passport.initialize() as a middleware adds them to every request, a cost each request carries.
  passport.initialize({ compat: false })(app.request, undefined as never, () => {});
  api.use(loadSignedIn((id) => users.findAuthUser(id)));
  api.use(csrfProtection);

  api.use(healthRoutes(db));
  const projects = projectsService(deps);
  const estimates = estimatesService(deps);
  const orders = ordersService(deps);
  /** One Idempotency-Key mechanism for every write a client may retry. */
  const idempotent = idempotency(db);
  const invoices = invoicesService(deps, payments);
  // The modules behind one gate that sends a request only to those with routes under its first path segment.
  api.use(
    apiModules([
      authRoutes(deps, auth, members, sessionStore),
      organisationsRoutes(db),
      membersRoutes(members),
      catalogueRoutes(catalogueService(deps)),
      projectsRoutes(projects),
      schedulesRoutes(schedulesService(deps), idempotent),
      estimatesRoutes(estimates),
      exportsRoutes(estimates, projects),
      // Before the orders' routes: it answers POST /orders/:id/delivery (JSON or multipart, with proof).
      deliveriesRoutes(
        deliveriesService(deps, (user, invoiceId, body) => invoices.credit(user, invoiceId, body)),
        idempotent,
      ),
      ordersRoutes(orders, idempotent, businessDay(config.calendar)),
      quotesRoutes(quotesService(deps, orders)),
      priceListRoutes(priceListService(deps)),
      stockRoutes(stockService(deps)),
      fleetRoutes(fleetService(deps)),
      slotsRoutes(slotsService(deps), orders.linesOf),
      runsRoutes(runsService(deps), () => config.appUrl),
      invoicesRoutes(invoices),
      paymentsRoutes(payments, config, idempotent),
      ...(config.isProduction ? [] : [outboxRoutes(db)]),
    ]),
  );
  api.use(apiNotFound);

  app.use('/api', api);

  // The outbox page shows the development mail reader: the same rule as its API route.
  app.get(['/outbox', '/outbox/{*rest}'], (req, res, next) => {
    if (!config.isProduction && fromLoopback(req)) return next();
    res.status(404).type('text/plain').send('Not found');
  });

  if (existsSync(join(CLIENT_DIR, 'index.html'))) {
    app.use(clientAssets(CLIENT_DIR));
    // The page itself is checked again on every visit, so a new build reaches people at once.
    // Pages are the app's own addresses; a file name that is not in the build is simply not there.
    app.get('/{*splat}', (req, res, next) => {
      if (/\.[a-z0-9]{1,8}$/i.test(req.path)) return next();
      res.sendFile(join(CLIENT_DIR, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } });
    });
  }

  app.use(errorHandler);
  return app;
}
