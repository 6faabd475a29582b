import { OWNER_ROLE } from '../../../shared/domain/roles';
import type { SignupBody } from '../../../shared/schemas/auth.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import { dummyPasswordHash, hashPassword, verifyPassword } from '../../auth/passwords';
import { hashToken, newToken } from '../../auth/tokens';
import { isoInHours } from '../../db/time';
import { AppError } from '../../http/app-error';
import { enqueueMail } from '../../mail/outbox';
import { runLater } from '../../mail/send-later';
import { renderEmail } from '../../mail/templates';
import { usersRepository } from '../members/users.repository';
import { organisationsRepository } from '../organisations/organisations.repository';
import { passwordResetsRepository } from './password-resets.repository';

export const RESET_TOKEN_HOURS = 1;

export function authService({ db, config, logger }: AppDeps) {
  const users = usersRepository(db);
  const organisations = organisationsRepository(db);
  const resets = passwordResetsRepository(db);

  return {
    /** Checks e-mail and password; an unknown e-mail costs the same time as a wrong password. */
    async verifyCredentials(email: string, password: string): Promise<AuthUser | null> {
      const user = await users.findByEmail(email);
      if (!user) {
        await verifyPassword(await dummyPasswordHash(), password);
        return null;
      }
      if (!(await verifyPassword(user.password_hash, password))) return null;
      return (await users.findAuthUser(user.id)) ?? null;
    },

    /** A new firm with the person signing up as its owner. */
    async signup(body: SignupBody): Promise<AuthUser> {
      const passwordHash = await hashPassword(body.password);
      const userId = await db.transaction(async (trx) => {
        if (await trx('users').where({ email: body.email }).first()) {
          throw AppError.conflict('signup_failed', 'We could not create an account with these details. If you already have one, sign in or reset your password.');
        }
        const org = await organisations.create({ name: body.organisation_name, kind: body.kind }, trx);
        return users.create({ organisation_id: org.id, email: body.email, name: body.name, role: OWNER_ROLE[body.kind], password_hash: passwordHash }, trx);
      });
      return (await users.findAuthUser(userId))!;
    },

    /**
     * Sends a reset link when the account exists; says nothing either way. The look-up, the token
     * and the e-mail all happen after the caller has its answer, so a known and an unknown address
     * cost the request the same. The token and its e-mail are written in one transaction.
     */
    requestPasswordReset(email: string): void {
      runLater(logger, 'password reset e-mail', async () => {
        const user = await users.findByEmail(email);
        if (!user) return;
        // Up to here both kinds of address do the same. The rest (a transaction, and the outbox's
        // worker waking on its commit) waits for the next turn of the event loop, so it never runs
        // before the answer has left.
        await new Promise((resolve) => setImmediate(resolve));
        const { token, tokenHash } = newToken();
        const url = `${config.appUrl}/reset-password?token=${encodeURIComponent(token)}`;
        const message = renderEmail({
          to: user.email,
          subject: 'Reset your Ridgeload password',
          heading: 'Reset your password',
          paragraphs: [`Hello ${user.name},`, `Someone asked to reset the password of your Ridgeload account. The link works once and for ${RESET_TOKEN_HOURS} hour.`],
          action: { label: 'Choose a new password', url },
          footnote: 'If you did not ask for this, you can ignore this e-mail; your password stays as it is.',
        });
        await db.transaction(async (trx) => {
          await resets.create(user.id, tokenHash, isoInHours(RESET_TOKEN_HOURS), trx);
          await enqueueMail(trx, message, config.mailDomain);
        });
      });
    },

    /** Sets a new password from a usable reset link; returns whose password it was. */
    async resetPassword(token: string, password: string): Promise<number> {
      const passwordHash = await hashPassword(password);
      return db.transaction(async (trx) => {
        const reset = await resets.findUsable(hashToken(token), trx);
        if (!reset) throw AppError.badRequest('token_invalid', 'This reset link has expired or was already used. Ask for a new one.');
        await users.setPassword(reset.user_id, passwordHash, trx);
        await resets.consumeAllForUser(reset.user_id, trx);
        return reset.user_id as number;
      });
    },
  };
}

export type AuthService = ReturnType<typeof authService>;
