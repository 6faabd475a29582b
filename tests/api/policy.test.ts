import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { POLICY } from '../../shared/domain/policy';
import { ROLES, kindOfRole, type Role } from '../../shared/domain/roles';
import { listRoutes } from '../../server/http/route-inventory';
import { Client, createTestApp, type TestApp } from '../setup/test-app';
import { makeOrgWithUser, makeUser, TEST_PASSWORD } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

describe('every API route declares its access rule', () => {
  it('lists the routes and finds an access rule on each one', () => {
    const routes = listRoutes(t.app).filter((r) => r.path.startsWith('/api/'));
    expect(routes.length).toBeGreaterThan(10);
    const missing = routes.filter((r) => !r.access).map((r) => `${r.method} ${r.path}`);
    expect(missing).toEqual([]);
  });

  it('names only actions that the policy table knows', () => {
    const unknown = listRoutes(t.app)
      .filter((r) => r.access && 'action' in r.access && !(r.access.action in POLICY))
      .map((r) => `${r.method} ${r.path}`);
    expect(unknown).toEqual([]);
  });

  it('keeps public routes to the sign-in flows, who is signed in, the CSRF token, health, the example schedule, the development outbox and the signed payment webhook', () => {
    const publicRoutes = listRoutes(t.app)
      .filter((r) => r.access && 'public' in r.access)
      .map((r) => `${r.method} ${r.path}`)
      .sort();
    expect(publicRoutes).toEqual(
      [
        'GET /api/auth/csrf',
        'GET /api/auth/session',
        'GET /api/dev/outbox',
        'GET /api/examples/openings.csv',
        'GET /api/examples/roof-schedule.csv',
        'GET /api/health',
        'GET /api/invitations/:token',
        'POST /api/auth/login',
        'POST /api/auth/logout',
        'POST /api/auth/password/forgot',
        'POST /api/auth/password/reset',
        'POST /api/auth/signup',
        'POST /api/invitations/:token/accept',
        'POST /api/payments/webhook',
      ].sort(),
    );
  });
});

/**
 * For each role, a signed-in user tries to read or change records that belong to another
 * organisation of each kind. Every attempt must be refused (403 for the role, or 404 because the
 * record is not theirs to see) and change nothing.
 */
describe('no role reaches another organisation’s records', () => {
  const attempts = (victim: { memberId: number; branchId?: number; invitationId: number }) => [
    { label: 'read a branch', method: 'get' as const, path: victim.branchId ? `/api/branches/${victim.branchId}` : undefined },
    { label: 'change a member’s role', method: 'patch' as const, path: `/api/members/${victim.memberId}`, body: { role: 'merchant_sales' } },
    { label: 'change a member’s role (contractor roles)', method: 'patch' as const, path: `/api/members/${victim.memberId}`, body: { role: 'contractor_estimator' } },
    { label: 'remove a member', method: 'delete' as const, path: `/api/members/${victim.memberId}` },
    { label: 'revoke an invitation', method: 'delete' as const, path: `/api/invitations/${victim.invitationId}` },
  ];

  async function makeVictim(kind: 'contractor' | 'merchant') {
    const owner = await makeOrgWithUser(t.db, kind, kind === 'merchant' ? 'merchant_owner' : 'contractor_owner');
    const member = await makeUser(t.db, owner.organisationId, kind === 'merchant' ? 'driver' : 'contractor_estimator');
    const [inv] = await t
      .db('invitations')
      .insert({
        organisation_id: owner.organisationId,
        email: `pending.${member.userId}@victim.test`,
        role: kind === 'merchant' ? 'merchant_sales' : 'contractor_estimator',
        token_hash: `hash-${kind}-${member.userId}`.padEnd(64, '0'),
        invited_by: owner.userId,
        expires_at: new Date(Date.now() + 86_400_000).toISOString(),
        created_at: new Date().toISOString(),
      })
      .returning('id');
    return { memberId: member.userId, branchId: owner.branchId, invitationId: (inv as { id: number }).id, organisationId: owner.organisationId };
  }

  for (const role of ROLES) {
    it(`${role}: every attempt on another contractor’s and another merchant’s records is refused`, async () => {
      const actor = await makeOrgWithUser(t.db, kindOfRole(role), role as Role);
      const c = new Client(t.app);
      expect((await c.login(actor.email, TEST_PASSWORD)).status).toBe(200);
      for (const kind of ['contractor', 'merchant'] as const) {
        const victim = await makeVictim(kind);
        const before = await t.db('users').where({ organisation_id: victim.organisationId }).orderBy('id');
        for (const a of attempts(victim)) {
          if (!a.path) continue;
          const res = a.method === 'get' ? await c.get(a.path) : await c.send(a.method, a.path, a.body);
          expect([403, 404, 422], `${role} → ${a.label} of a ${kind}: ${res.status}`).toContain(res.status);
        }
        const after = await t.db('users').where({ organisation_id: victim.organisationId }).orderBy('id');
        expect(after).toEqual(before);
        const inv = await t.db('invitations').where({ id: victim.invitationId }).first();
        expect(inv.revoked_at).toBeNull();
      }
      // And their own lists show only their own organisation.
      const members = await c.get('/api/members');
      if (members.status === 200) {
        const ids = await t.db('users').where({ organisation_id: actor.organisationId }).pluck('id');
        expect(members.body.members.map((m: { id: number }) => m.id).sort()).toEqual(ids.sort());
      } else {
        expect(members.status).toBe(403);
      }
    });
  }
});
