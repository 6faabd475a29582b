import type { Role } from '../../../shared/domain/roles';
import type { AuthUser } from '../../auth/auth-user';
import { LRUCache } from 'lru-cache';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';

export interface UserRow {
  id: number;
  organisation_id: number;
  email: string;
  name: string;
  role: Role;
  password_hash: string;
  created_at: string;
}

const PUBLIC_COLUMNS = ['id', 'email', 'name', 'role', 'created_at'] as const;

/**
 * Signed-in users as every request sees them, remembered per database. Each request needs its user
 * and organisation; they change only through this repository (role, removal), which forgets the
 * user at once. A read that began before such a change is not remembered (the user's generation has
 * moved), so an old role can never be put back. The time limit only bounds memory.
 */
interface AuthUserMemory {
  users: LRUCache<number, AuthUser>;
  generations: Map<number, number>;
}
const memories = new WeakMap<Db, AuthUserMemory>();
function memoryOf(db: Db): AuthUserMemory {
  let m = memories.get(db);
  if (!m) {
    m = { users: new LRUCache({ max: 10_000, ttl: 10 * 60_000 }), generations: new Map() };
    memories.set(db, m);
  }
  return m;
}

export function usersRepository(db: Db) {
  const memory = memoryOf(db);
  const forget = (userId: number) => {
    memory.users.delete(userId);
    memory.generations.set(userId, (memory.generations.get(userId) ?? 0) + 1);
  };
  async function readAuthUser(id: number): Promise<AuthUser | undefined> {
    const row = await db('users as u')
      .join('organisations as o', 'o.id', 'u.organisation_id')
      .select('u.id', 'u.email', 'u.name', 'u.role', 'o.id as org_id', 'o.name as org_name', 'o.kind as org_kind')
      .where('u.id', id)
      .first();
    if (!row) return undefined;
    return {
      id: row.id,
      email: row.email,
      name: row.name,
      role: row.role,
      organisation: { id: row.org_id, name: row.org_name, kind: row.org_kind },
    };
  }

  return {
    async findByEmail(email: string): Promise<UserRow | undefined> {
      return db('users').where({ email: email.toLowerCase() }).first();
    },

    /** The session's view of a user: the person and their organisation in one read. */
    async findAuthUser(id: number): Promise<AuthUser | undefined> {
      const known = memory.users.get(id);
      if (known) return known;
      const generation = memory.generations.get(id) ?? 0;
      const user = await readAuthUser(id);
      if (user && (memory.generations.get(id) ?? 0) === generation) memory.users.set(id, user);
      return user;
    },

    async create(
      input: { organisation_id: number; email: string; name: string; role: Role; password_hash: string },
      trx: Db = db,
    ): Promise<number> {
      const [row] = await trx('users')
        .insert({ ...input, email: input.email.toLowerCase(), created_at: nowIso() })
        .returning('id');
      return typeof row === 'object' ? (row as { id: number }).id : (row as number);
    },

    async setPassword(userId: number, passwordHash: string, trx: Db = db): Promise<void> {
      forget(userId);
      await trx('users').where({ id: userId }).update({ password_hash: passwordHash });
    },

    async listMembers(organisationId: number) {
      return db('users').select(...PUBLIC_COLUMNS).where({ organisation_id: organisationId }).orderBy('name');
    },

    async findMember(organisationId: number, userId: number, trx: Db = db) {
      return trx('users').select(...PUBLIC_COLUMNS).where({ organisation_id: organisationId, id: userId }).first();
    },

    async countWithRole(organisationId: number, role: Role, trx: Db = db): Promise<number> {
      const row = await trx('users').where({ organisation_id: organisationId, role }).count({ n: '*' }).first();
      return Number(row?.n ?? 0);
    },

    async updateRole(organisationId: number, userId: number, role: Role, trx: Db = db): Promise<void> {
      forget(userId);
      await trx('users').where({ organisation_id: organisationId, id: userId }).update({ role });
      forget(userId);
    },

    async remove(organisationId: number, userId: number, trx: Db = db): Promise<void> {
      forget(userId);
      await trx('users').where({ organisation_id: organisationId, id: userId }).delete();
      forget(userId);
    },
  };
}
