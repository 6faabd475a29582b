import { acceptInvitationBodySchema, forgotPasswordBodySchema, loginBodySchema, resetPasswordBodySchema, signupBodySchema } from '../../../shared/schemas/auth.schema';
import { tokenParamsSchema } from '../../../shared/schemas/members.schema';
import type { AppDeps } from '../../app-deps';
import { issueCsrfToken } from '../../auth/csrf';
import { loginRateLimit, resetRateLimit } from '../../auth/rate-limits';
import type { SessionStore } from '../../auth/session-store';
import { currentUser } from '../../auth/policy';
import { logIn, logOut, sessionBody } from '../../auth/session';
import { AppError } from '../../http/app-error';
import { apiRouter } from '../../http/endpoint';
import type { MembersService } from '../members/members.service';
import type { AuthService } from './auth.service';

export function authRoutes(deps: AppDeps, auth: AuthService, members: MembersService, sessions: Pick<SessionStore, 'endAllFor'>) {
  const r = apiRouter();
  const resetLimit = resetRateLimit(deps.db, deps.config.resetRateLimit);

  r.get('/auth/csrf', { access: { public: 'hands out the token that state-changing requests must echo' } }, (req, res) => {
    res.json({ token: issueCsrfToken(req) });
  });

  r.post('/auth/login', { access: { public: 'signing in' }, before: [loginRateLimit(deps.db, deps.config.loginRateLimit)], body: loginBodySchema }, async (req, res, { body }) => {
    const user = await auth.verifyCredentials(body.email, body.password);
    if (!user) throw new AppError(401, 'invalid_credentials', 'E-mail or password is wrong');
    await logIn(req, user);
    res.json(sessionBody(user, deps.config));
  });

  // "Nobody is signed in" is an answer, not a failure: signed-out pages ask this and get a 200 either way.
  r.get('/auth/session', { access: { public: 'says whether anyone is signed in, and who' } }, (req, res) => {
    res.json({ session: req.user ? sessionBody(currentUser(req), deps.config) : null });
  });

  r.get('/auth/me', { access: { signedIn: true } }, (req, res) => {
    res.json(sessionBody(currentUser(req), deps.config));
  });

  r.post('/auth/logout', { access: { public: 'signing out is harmless when signed out' } }, async (req, res) => {
    if (req.user) await logOut(req);
    res.status(204).end();
  });

  r.post('/auth/signup', { access: { public: 'creating a firm and its owner' }, body: signupBodySchema }, async (req, res, { body }) => {
    const user = await auth.signup(body);
    await logIn(req, user);
    res.status(201).json(sessionBody(user, deps.config));
  });

  r.post('/auth/password/forgot', { access: { public: 'asking for a reset link' }, before: [resetLimit], body: forgotPasswordBodySchema }, async (_req, res, { body }) => {
    res.status(202).json({ ok: true });
    auth.requestPasswordReset(body.email);
  });

  r.post('/auth/password/reset', { access: { public: 'using a reset link' }, before: [resetLimit], body: resetPasswordBodySchema }, async (req, res, { body }) => {
    const userId = await auth.resetPassword(body.token, body.password);
    // Whoever held the old password is signed out everywhere (this browser is not signed in here).
    await sessions.endAllFor(userId, req.sessionID);
    res.json({ ok: true });
  });

  r.get('/invitations/:token', { access: { public: 'reading an invitation one holds the token of' }, params: tokenParamsSchema }, async (_req, res, { params }) => {
    res.json(await members.previewInvitation(params.token));
  });

  r.post('/invitations/:token/accept', { access: { public: 'joining a firm through an invitation' }, params: tokenParamsSchema, body: acceptInvitationBodySchema }, async (req, res, { params, body }) => {
    const user = await members.acceptInvitation(params.token, body);
    await logIn(req, user);
    res.status(201).json(sessionBody(user, deps.config));
  });

  return r.router;
}
