import type { OrganisationKind, Role } from '../../shared/domain/roles';
import { hash } from '@node-rs/argon2';
import type { Db } from '../../server/db/knex';

let counter = 0;
const unique = () => `${Date.now().toString(36)}${(counter++).toString(36)}`;
let cachedHash: Promise<string> | undefined;
export const TEST_PASSWORD = 'correct-horse-battery';

/**
 * The people tests make get an argon2id hash at the smallest cost (1 MiB, one pass): signing in
 * verifies at the cost the hash names, and the suite signs in hundreds of times. The app's own
 * hashes (sign-up, invitations, resets, the demo seeds) keep the library's defaults.
 */
const TEST_HASH_COST = { memoryCost: 1024, timeCost: 1, parallelism: 1 };

/** An organisation (with one branch when it is a merchant) and one person in the given role. */
export async function makeOrgWithUser(db: Db, kind: OrganisationKind, role: Role, name = `Test ${kind} ${unique()}`) {
  const now = new Date().toISOString();
  const [org] = await db('organisations').insert({ name, kind, created_at: now }).returning('id');
  const organisationId = (org as { id: number }).id;
  let branchId: number | undefined;
  if (kind === 'merchant') {
    const [b] = await db('branches')
      .insert({ organisation_id: organisationId, name: `${name} yard`, address: '1 Test Lane', town: 'Testbury', phone: null, created_at: now })
      .returning('id');
    branchId = (b as { id: number }).id;
  }
  const user = await makeUser(db, organisationId, role);
  return { organisationId, branchId, ...user };
}

export async function makeUser(db: Db, organisationId: number, role: Role) {
  cachedHash ??= hash(TEST_PASSWORD, TEST_HASH_COST);
  const email = `${role}.${unique()}@example.test`;
  const [u] = await db('users')
    .insert({ organisation_id: organisationId, email, name: `Person ${unique()}`, role, password_hash: await cachedHash, created_at: new Date().toISOString() })
    .returning('id');
  return { userId: (u as { id: number }).id, email, password: TEST_PASSWORD };
}
