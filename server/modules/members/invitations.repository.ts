import type { Role } from '../../../shared/domain/roles';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';

export interface InvitationRow {
  id: number;
  organisation_id: number;
  email: string;
  role: Role;
  token_hash: string;
  expires_at: string;
  accepted_at: string | null;
  revoked_at: string | null;
  created_at: string;
}

const LIST_COLUMNS = ['id', 'email', 'role', 'expires_at', 'created_at'] as const;

export function invitationsRepository(db: Db) {
  return {
    async create(
      input: {
        organisation_id: number;
        email: string;
        role: Role;
        token_hash: string;
        invited_by: number;
        expires_at: string;
      },
      trx: Db = db,
    ) {
      const [row] = await trx('invitations')
        .insert({ ...input, created_at: nowIso() })
        .returning([...LIST_COLUMNS]);
      return row as Pick<InvitationRow, (typeof LIST_COLUMNS)[number]>;
    },

    async listPending(organisationId: number) {
      return db('invitations')
        .select(...LIST_COLUMNS)
        .where({ organisation_id: organisationId })
        .whereNull('accepted_at')
        .whereNull('revoked_at')
        .where('expires_at', '>', nowIso())
        .orderBy('created_at', 'desc');
    },

    /** An invitation that can still be used: not accepted, not revoked, not expired. */
    async findUsable(tokenHash: string, trx: Db = db): Promise<InvitationRow | undefined> {
      return trx('invitations').where({ token_hash: tokenHash }).whereNull('accepted_at').whereNull('revoked_at').where('expires_at', '>', nowIso()).first();
    },

    /** Marks it used; returns false when another request used it first. */
    async markAccepted(id: number, trx: Db = db): Promise<boolean> {
      const n = await trx('invitations').where({ id }).whereNull('accepted_at').update({ accepted_at: nowIso() });
      return n === 1;
    },

    async revoke(organisationId: number, id: number): Promise<boolean> {
      const n = await db('invitations').where({ id, organisation_id: organisationId }).whereNull('accepted_at').whereNull('revoked_at').update({ revoked_at: nowIso() });
      return n === 1;
    },
  };
}
