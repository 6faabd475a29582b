import { databaseFingerprint } from '../setup/db-fingerprint';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { can } from '../../shared/domain/policy';
import { ROLES, kindOfRole, type Role } from '../../shared/domain/roles';
import { listRoutes, type RouteEntry } from '../../server/http/route-inventory';
import { Client, createTestApp, type TestApp } from '../setup/test-app';
import { signIn } from '../setup/scenario';
import { tradingPair, type TradingPair } from '../setup/two-firms-world';

/**
 * Every API route × every role × own firm and another firm, generated from the route inventory:
 * a new route with a path parameter this file cannot fill fails the first test, so no route is left
 * out. Another firm's records are never reached (403 or 404, or 422 for a body that names them) and
 * nothing changes anywhere; a role the policy leaves out gets 403 on its own firm's records too.
 */

let t: TestApp;
let own: TradingPair;
let other: TradingPair;
const actors = new Map<Role, Client>();

beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '10000' });
  own = await tradingPair(t, 0);
  other = await tradingPair(t, 1);
  for (const role of ROLES) actors.set(role, await signIn(t.app, own.emails[role]));
}, 120_000);
afterAll(async () => t.close());

type Ids = TradingPair['ids'];

/** The id each path parameter takes, by the route's first segment and the parameter's name. */
function paramValue(route: string, param: string, ids: Ids, role: Role): number | undefined {
  const seg = route.split('/')[2];
  const merchantSide = kindOfRole(role) === 'merchant';
  const table: Record<string, number | undefined> = {
    'members:id': merchantSide ? ids.merchantMemberId : ids.contractorMemberId,
    'invitations:id': ids.invitationId,
    'systems:id': ids.systemId,
    'branches:id': ids.branchId,
    'branches:productId': ids.productId,
    'projects:id': ids.projectId,
    'projects:version': 1,
    'estimates:id': ids.estimateId,
    'orders:id': route.includes(':proposalId')
      ? ids.offeredOrderId
      : route.endsWith('/slot')
        ? ids.confirmedOrderId
        : route.includes('/pallets/')
          ? ids.bookedOrderId
          : route.includes('/delivery')
            ? ids.deliveredOrderId
            : ids.orderId,
    'orders:proposalId': ids.proposalId,
    'orders:lineId': ids.orderLineId,
    'orders:pallet': 1,
    'orders:photoId': ids.photoId,
    'runs:id': ids.runId,
    'runs:index': 0,
    'credit-note-drafts:id': ids.creditDraftId,
    'quote-requests:id': ids.quoteRequestId,
    'quotes:id': ids.quoteId,
    'products:id': ids.productId,
    'roof-systems:id': ids.systemId,
    'lorries:id': ids.lorryId,
    'slots:id': ids.slotId,
    'invoices:id': ids.invoiceId,
    // No credit note or payment exists in the world: the id of another firm's invoice stands in.
    'credit-notes:id': ids.invoiceId,
    'payments:id': ids.invoiceId,
    'accounts:contractorId': ids.contractorOrgId,
  };
  return table[`${seg}:${param}`];
}

function concretePath(r: RouteEntry, ids: Ids, role: Role): string | undefined {
  let missing = false;
  const path = r.path.replace(/:([A-Za-z]+)/g, (_m, name: string) => {
    const v = paramValue(r.path, name, ids, role);
    if (v === undefined) missing = true;
    return String(v);
  });
  if (missing) return undefined;
  return r.path === '/api/estimates/compare' ? `${path}?a=${ids.estimateId}&b=${ids.estimateId}` : path;
}

/** Bodies that are valid except that they name another firm's records (own record in the path). */
const BODY_IDS: Record<string, (own: Ids, other: Ids) => Record<string, unknown>> = {
  'POST /api/orders': (o, x) => ({ estimate_id: x.estimateId, branch_id: o.branchId, requested_date: '2027-01-15', delivery_method: 'ground' }),
  'PATCH /api/orders/:id': (_o, x) => ({ revision: 1, lines: [{ product_id: x.productId, quantity: 1 }] }),
  'POST /api/orders/:id/proposals': (_o, x) => ({ revision: 1, proposed_slot_id: x.slotId }),
  'POST /api/orders/:id/confirm': (_o, x) => ({ slot_id: x.slotId }),
  'PUT /api/orders/:id/slot': (_o, x) => ({ slot_id: x.slotId }),
  'POST /api/quote-requests': (o, x) => ({ estimate_id: x.estimateId, branch_ids: [o.branchId], requested_date: '2027-01-15', delivery_method: 'ground' }),
  'POST /api/roof-systems': (_o, x) => ({ branch_id: x.branchId, name: 'Borrowed', components: { tile: x.productId } }),
  'PATCH /api/roof-systems/:id': (_o, x) => ({ components: { tile: x.productId } }),
  'POST /api/branches/:id/slots': (_o, x) => ({ lorry_id: x.lorryId, date: '2027-01-15', time_window: '07:30-12:00', driver_id: x.driverId }),
  'POST /api/branches/:id/slots/generate': (_o, x) => ({ from: '2027-01-11', to: '2027-01-15', weekdays: [1], time_windows: ['07:30-12:00'], lorry_ids: [x.lorryId] }),
  'PATCH /api/slots/:id': (_o, x) => ({ driver_id: x.driverId }),
  'POST /api/invoices/:id/credit-notes': (_o, x) => ({ reason: 'damaged', lines: [{ invoice_line_id: x.invoiceLineId, quantity: 1 }] }),
  'POST /api/projects/:id/estimates': (_o, x) => ({ system_id: x.systemId + 100_000 }),
};

/** Everything the API can change, as one fingerprint (sessions aside: signing in writes them). */
async function fingerprint(): Promise<string> {
  return databaseFingerprint(t.db, ['sessions', 'rate_limit_hits']);
}

const apiRoutes = () => listRoutes(t.app).filter((r) => r.path.startsWith('/api/'));
const key = (r: RouteEntry) => `${r.method} ${r.path}`;

/**
 * Reads that are meant to cross firms, each with its reason. A merchant's roof systems are its
 * published catalogue: every contractor picks from them, and estimates name them.
 */
const SHARED_READS = new Set(['GET /api/systems/:id']);

/** Routes that take a file (CSV or .xlsx) rather than JSON: they get a small CSV. */
const UPLOADS = new Set(['POST /api/projects/:id/schedule', 'POST /api/projects/:id/schedule/openings', 'PUT /api/projects/:id/schedule', 'POST /api/branches/:id/price-list', 'POST /api/branches/:id/stock-counts']);
const SMALL_CSV = 'sku,price,tax_rate\nTRS-FL420-SG,1.30,20\n';

async function send(c: Client, method: string, path: string, body?: unknown, route?: RouteEntry) {
  const m = method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  if (m === 'get') return c.get(path);
  if (route && UPLOADS.has(key(route))) {
    const token = await c.csrf();
    return c.agent[m](path).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(SMALL_CSV);
  }
  return c.send(m, path, body ?? {});
}

describe('the access matrix, generated from the route inventory', () => {
  it('can fill every path parameter of every route', () => {
    const unfilled = apiRoutes()
      .filter((r) => !('public' in (r.access ?? {})))
      .filter((r) => ROLES.some((role) => concretePath(r, own.ids, role) === undefined))
      .map(key);
    expect(unfilled).toEqual([]);
  });

  it('names only routes that exist in its body-id table', () => {
    const known = new Set(apiRoutes().map(key));
    expect(Object.keys(BODY_IDS).filter((k) => !known.has(k))).toEqual([]);
  });

  it('every role × every route on another firm’s records: refused (403/404, or 422 for a body naming them), and nothing changes', async () => {
    const before = await fingerprint();
    const leaks: string[] = [];
    let tried = 0;
    for (const role of ROLES) {
      const c = actors.get(role)!;
      for (const r of apiRoutes()) {
        // Routes without an id in the path read or add to the caller's own firm: the next tests cover them.
        if (!r.access || 'public' in r.access || 'signedIn' in r.access || !r.path.includes(':')) continue;
        const path = concretePath(r, other.ids, role)!;
        const res = await send(c, r.method, path, BODY_IDS[key(r)]?.(other.ids, other.ids) ?? {}, r);
        tried++;
        const allowed = can(role, r.access.action);
        const ok = !allowed ? res.status === 403 : SHARED_READS.has(key(r)) ? res.status < 500 : [403, 404, 422].includes(res.status);
        if (!ok) leaks.push(`${role} ${r.method} ${path}: ${res.status} ${JSON.stringify(res.body).slice(0, 160)}`);
      }
    }
    expect(leaks).toEqual([]);
    expect(tried).toBeGreaterThan(400);
    expect(await fingerprint()).toBe(before);
  }, 120_000);

  it('every role × every write on its own firm’s records naming another firm’s ids in the body: refused (403/404/422), and nothing changes', async () => {
    const before = await fingerprint();
    const leaks: string[] = [];
    for (const role of ROLES) {
      const c = actors.get(role)!;
      for (const r of apiRoutes()) {
        const body = BODY_IDS[key(r)];
        if (!body || !r.access || !('action' in r.access)) continue;
        const res = await send(c, r.method, concretePath(r, own.ids, role)!, body(own.ids, other.ids));
        const ok = can(role, r.access.action) ? [403, 404, 422].includes(res.status) : res.status === 403;
        if (!ok) leaks.push(`${role} ${key(r)}: ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`);
      }
    }
    expect(leaks).toEqual([]);
    expect(await fingerprint()).toBe(before);
  }, 60_000);

  it('every role × every route on its own firm’s records: a role the policy leaves out gets 403 and changes nothing; a permitted read answers', async () => {
    const before = await fingerprint();
    const wrong: string[] = [];
    for (const role of ROLES) {
      const c = actors.get(role)!;
      for (const r of apiRoutes()) {
        if (!r.access || !('action' in r.access)) continue;
        const allowed = can(role, r.access.action);
        if (allowed && r.method !== 'GET') continue;
        const path = concretePath(r, own.ids, role)!;
        const res = await send(c, r.method, path, {}, r);
        if (!allowed && res.status !== 403) wrong.push(`${role} ${r.method} ${path}: ${res.status} (policy says no)`);
        if (allowed && (res.status >= 500 || res.status === 401 || res.status === 403)) wrong.push(`${role} ${r.method} ${path}: ${res.status} (policy says yes)`);
      }
    }
    expect(wrong).toEqual([]);
    expect(await fingerprint()).toBe(before);
  }, 120_000);

  it('routes for any signed-in person answer them and refuse the signed-out', async () => {
    for (const r of apiRoutes().filter((x) => x.access && 'signedIn' in x.access)) {
      for (const role of ROLES) expect((await send(actors.get(role)!, r.method, r.path)).status, `${role} ${key(r)}`).toBeLessThan(400);
      const anon = new Client(t.app);
      expect((await send(anon, r.method, r.path)).status).toBe(401);
    }
  });

  it('refuses every non-public route to the signed-out with 401 (or 403 for a write without a session token)', async () => {
    const anon = new Client(t.app);
    const wrong: string[] = [];
    for (const r of apiRoutes()) {
      if (!r.access || 'public' in r.access) continue;
      const res = await send(anon, r.method, concretePath(r, own.ids, 'contractor_owner')!);
      if (res.status !== 401) wrong.push(`${key(r)}: ${res.status}`);
    }
    expect(wrong).toEqual([]);
  });
});
