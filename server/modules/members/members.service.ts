import { OWNER_ROLE, ROLE_LABELS, ROLES_BY_KIND, type Role } from '../../../shared/domain/roles';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import { hashPassword } from '../../auth/passwords';
import { hashToken, newToken } from '../../auth/tokens';
import { isoInHours } from '../../db/time';
import { AppError } from '../../http/app-error';
import { enqueueMail } from '../../mail/outbox';
import { renderEmail } from '../../mail/templates';
import { organisationsRepository } from '../organisations/organisations.repository';
import { invitationsRepository } from './invitations.repository';
import { usersRepository } from './users.repository';

export const INVITATION_HOURS = 7 * 24;

function assertRoleFitsOrganisation(actor: AuthUser, role: Role) {
  if (!ROLES_BY_KIND[actor.organisation.kind].includes(role)) {
    throw AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path: 'role', message: `A ${actor.organisation.kind} firm cannot have the role ${ROLE_LABELS[role]}` }]);
  }
}

export function membersService({ db, config }: AppDeps) {
  const users = usersRepository(db);
  const invitations = invitationsRepository(db);
  const organisations = organisationsRepository(db);

  return {
    list: (actor: AuthUser) => users.listMembers(actor.organisation.id),

    async changeRole(actor: AuthUser, userId: number, role: Role) {
      assertRoleFitsOrganisation(actor, role);
      return db.transaction(async (trx) => {
        const member = await users.findMember(actor.organisation.id, userId, trx);
        if (!member) throw AppError.notFound('Member');
        const owner = OWNER_ROLE[actor.organisation.kind];
        if (member.role === owner && role !== owner && (await users.countWithRole(actor.organisation.id, owner, trx)) <= 1) {
          throw AppError.conflict('last_owner', 'A firm needs at least one owner; make someone else owner first');
        }
        await users.updateRole(actor.organisation.id, userId, role, trx);
        return { ...member, role };
      });
    },

    async remove(actor: AuthUser, userId: number) {
      if (userId === actor.id) throw AppError.conflict('cannot_remove_self', 'You cannot remove yourself; ask another owner');
      const member = await users.findMember(actor.organisation.id, userId);
      if (!member) throw AppError.notFound('Member');
      await users.remove(actor.organisation.id, userId);
    },

    listInvitations: (actor: AuthUser) => invitations.listPending(actor.organisation.id),

    /**
     * Records the invitation and mails it. An address that already has an account (with any firm)
     * is answered exactly like any other, so the answer tells the inviter nothing about who has an
     * account; that person is told by e-mail instead, with no link, and nobody's firm changes.
     */
    async invite(actor: AuthUser, email: string, role: Role) {
      assertRoleFitsOrganisation(actor, role);
      const existing = await users.findByEmail(email);
      const { token, tokenHash } = newToken();
      const url = `${config.appUrl}/invitations/${encodeURIComponent(token)}`;
      const message = existing
        ? renderEmail({
            to: email,
            subject: `${actor.name} invited you to ${actor.organisation.name} on Ridgeload`,
            heading: 'Your address is already in use',
            paragraphs: [
              `${actor.name} invited this address to work in Ridgeload for ${actor.organisation.name} as ${ROLE_LABELS[role]}.`,
              existing.organisation_id === actor.organisation.id
                ? `This address already belongs to a member of ${actor.organisation.name}, so nothing changes.`
                : 'This address is already in use with another firm on Ridgeload, and an address belongs to one firm only, so nothing changes: you stay where you are.',
              `To work for ${actor.organisation.name} as well, ask them to invite another address of yours.`,
            ],
            footnote: 'If you do not know this firm, ignore this e-mail.',
          })
        : renderEmail({
            to: email,
            subject: `${actor.name} invited you to ${actor.organisation.name} on Ridgeload`,
            heading: `Join ${actor.organisation.name}`,
            paragraphs: [`${actor.name} has invited you to work in Ridgeload for ${actor.organisation.name} as ${ROLE_LABELS[role]}.`, 'The link works once and for seven days.'],
            action: { label: 'Accept the invitation', url },
            footnote: 'If you do not know this firm, ignore this e-mail.',
          });
      // The invitation and its e-mail are written together; the outbox's worker sends it.
      return db.transaction(async (trx) => {
        const invitation = await invitations.create(
          {
            organisation_id: actor.organisation.id,
            email,
            role,
            token_hash: tokenHash,
            invited_by: actor.id,
            expires_at: isoInHours(INVITATION_HOURS),
          },
          trx,
        );
        await enqueueMail(trx, message, config.mailDomain);
        return invitation;
      });
    },

    async revokeInvitation(actor: AuthUser, id: number) {
      if (!(await invitations.revoke(actor.organisation.id, id))) throw AppError.notFound('Invitation');
    },

    async previewInvitation(token: string) {
      const invitation = await invitations.findUsable(hashToken(token));
      if (!invitation) throw new AppError(404, 'token_invalid', 'This invitation has expired, was revoked or was already used');
      const org = (await organisations.findById(invitation.organisation_id))!;
      return { email: invitation.email, role: invitation.role, organisation: { name: org.name, kind: org.kind } };
    },

    /** Creates the account and uses the invitation in one transaction; a second use finds it gone. */
    async acceptInvitation(token: string, input: { name: string; password: string }): Promise<AuthUser> {
      const passwordHash = await hashPassword(input.password);
      const userId = await db.transaction(async (trx) => {
        const invitation = await invitations.findUsable(hashToken(token), trx);
        if (!invitation || !(await invitations.markAccepted(invitation.id, trx))) {
          throw new AppError(404, 'token_invalid', 'This invitation has expired, was revoked or was already used');
        }
        if (await trx('users').where({ email: invitation.email }).first()) {
          throw AppError.conflict('already_member', 'This e-mail address already has a Ridgeload account; sign in instead');
        }
        return users.create({ organisation_id: invitation.organisation_id, email: invitation.email, name: input.name, role: invitation.role, password_hash: passwordHash }, trx);
      });
      return (await users.findAuthUser(userId))!;
    },
  };
}

export type MembersService = ReturnType<typeof membersService>;
