import type { Role } from '../../../shared/domain/roles';
import type { AuthUser } from '../../auth/auth-user';
import { peekRow, type Db } from '../../db/knex';
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

interface AuthUserRow {
  id: number;
  email: string;
  name: string;
  role: Role;
  org_id: number;
  org_name: string;
  org_kind: AuthUser['organisation']['kind'];
}
const AUTH_USER_SQL = 'select u.id, u.email, u.name, u.role, o.id as org_id, o.name as org_name, o.kind as org_kind from users u join organisations o on o.id = u.organisation_id where u.id = ?';

export function usersRepository(db: Db) {
  /**
   * Read on every signed-in request, never kept in memory, so a role change or a removal made through
   * any server counts at once on all of them. On SQLite it goes straight to the open connection
   * when no transaction is open there (the busiest read in the app).
   */
  async function readAuthUser(id: number): Promise<AuthUser | undefined> {
    const peek = peekRow<AuthUserRow>(db, AUTH_USER_SQL, id);
    const row = peek
      ? peek.row
      : ((await db('users as u')
          .join('organisations as o', 'o.id', 'u.organisation_id')
          .select('u.id', 'u.email', 'u.name', 'u.role', 'o.id as org_id', 'o.name as org_name', 'o.kind as org_kind')
          .where('u.id', id)
          .first()) as AuthUserRow | undefined);
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
      return readAuthUser(id);
    },

    async create(input: { organisation_id: number; email: string; name: string; role: Role; password_hash: string }, trx: Db = db): Promise<number> {
      const [row] = await trx('users')
        .insert({ ...input, email: input.email.toLowerCase(), created_at: nowIso() })
        .returning('id');
      return typeof row === 'object' ? (row as { id: number }).id : (row as number);
    },

    async setPassword(userId: number, passwordHash: string, trx: Db = db): Promise<void> {
      await trx('users').where({ id: userId }).update({ password_hash: passwordHash });
    },

    async listMembers(organisationId: number) {
      return db('users')
        .select(...PUBLIC_COLUMNS)
        .where({ organisation_id: organisationId })
        .orderBy('name');
    },

    async findMember(organisationId: number, userId: number, trx: Db = db) {
      return trx('users')
        .select(...PUBLIC_COLUMNS)
        .where({ organisation_id: organisationId, id: userId })
        .first();
    },

    async countWithRole(organisationId: number, role: Role, trx: Db = db): Promise<number> {
      const row = await trx('users').where({ organisation_id: organisationId, role }).count({ n: '*' }).first();
      return Number(row?.n ?? 0);
    },

    async updateRole(organisationId: number, userId: number, role: Role, trx: Db = db): Promise<void> {
      await trx('users').where({ organisation_id: organisationId, id: userId }).update({ role });
    },

    async remove(organisationId: number, userId: number, trx: Db = db): Promise<void> {
      await trx('users').where({ organisation_id: organisationId, id: userId }).delete();
    },
  };
}
