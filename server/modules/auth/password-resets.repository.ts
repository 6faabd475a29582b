import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';

export function passwordResetsRepository(db: Db) {
  return {
    async create(userId: number, tokenHash: string, expiresAt: string, trx: Db = db): Promise<void> {
      await trx('password_resets').insert({ user_id: userId, token_hash: tokenHash, expires_at: expiresAt, created_at: nowIso() });
    },

    async findUsable(tokenHash: string, trx: Db = db): Promise<{ id: number; user_id: number } | undefined> {
      return trx('password_resets').select('id', 'user_id').where({ token_hash: tokenHash }).whereNull('used_at').where('expires_at', '>', nowIso()).first();
    },

    /** Marks this token and every other open token of the user as used, so each link works once. */
    async consumeAllForUser(userId: number, trx: Db = db): Promise<void> {
      await trx('password_resets').where({ user_id: userId }).whereNull('used_at').update({ used_at: nowIso() });
    },
  };
}
