import { expect } from 'vitest';
import { DEMO_CATALOGUES, installCatalogue } from '../../seeds/02-catalogue';
import { makeOrgWithUser, makeUser } from './factories';
import { GABLE_CSV, inDays, signIn } from './scenario';
import type { TestApp } from './test-app';

/** A merchant with one branch selling a demo catalogue, and its desk, yard and driver. */
export async function merchantWithCatalogue(t: TestApp, catalogue = DEMO_CATALOGUES[0]) {
  const owner = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
  const installed = await installCatalogue(t.db, owner.organisationId, [{ id: owner.branchId!, priceFactor: 1, stockFactor: 1 }], catalogue);
  const sales = await makeUser(t.db, owner.organisationId, 'merchant_sales');
  const dispatcher = await makeUser(t.db, owner.organisationId, 'merchant_dispatcher');
  const driver = await makeUser(t.db, owner.organisationId, 'driver');
  return {
    organisationId: owner.organisationId,
    branchId: owner.branchId!,
    ownerEmail: owner.email,
    salesEmail: sales.email,
    dispatcherEmail: dispatcher.email,
    driverEmail: driver.email,
    driverId: driver.userId,
    product: (sku: string) => installed.productIds.get(sku)!,
    systemId: installed.systemIds[0].id,
  };
}
export type TestMerchant = Awaited<ReturnType<typeof merchantWithCatalogue>>;

/**
 * A contractor's estimator with a site (crane allowed, no overhead lines unless `site` says otherwise),
 * the gable schedule imported and an estimate from the merchant's first system.
 */
export async function contractorWithEstimate(t: TestApp, m: Pick<TestMerchant, 'systemId'>, site: Record<string, string> = {}, csv = GABLE_CSV) {
  const u = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator');
  const c = await signIn(t.app, u.email);
  const p = await c.post('/api/projects', {
    name: 'Ferncombe Mews',
    site_address: '1–4 Ferncombe Mews, Tollerbeck',
    contact_name: 'Lowri Haskett',
    contact_phone: '07700 900 301',
    crane_lift: 'allowed',
    overhead_lines: 'none',
    set_down_place: 'Verge by plot 1',
    ...site,
  });
  expect(p.status, JSON.stringify(p.body)).toBe(201);
  const token = await c.csrf();
  await c.agent.post(`/api/projects/${p.body.id}/schedule`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(csv);
  const e = await c.post(`/api/projects/${p.body.id}/estimates`, { system_id: m.systemId });
  expect(e.status, JSON.stringify(e.body)).toBe(201);
  return { ...u, c, projectId: p.body.id as number, estimate: e.body };
}

/** The first e-mail to an address whose subject matches, waiting up to 5 s for it. */
export async function mailTo(t: TestApp, address: string, subject: RegExp) {
  for (let i = 0; i < 50; i++) {
    const found = t.mail.messages.find((m) => m.to.includes(address) && subject.test(m.subject));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no e-mail to ${address} matching ${subject}`);
}

/** The body of an order for the estimate, sent to the merchant's branch a week ahead. */
export const orderBody = (k: { estimate: { id: number } }, m: { branchId: number }, over: Record<string, unknown> = {}) => ({
  estimate_id: k.estimate.id,
  branch_id: m.branchId,
  requested_date: inDays(7),
  time_window: '07:30-12:00',
  delivery_method: 'ground',
  po_reference: 'PO-4471',
  ...over,
});

/** Ticks every pallet of the run an order is booked on as loaded, as the yard does before it goes out. */
export async function loadRunOf(client: { get: (p: string) => PromiseLike<{ status: number; body: unknown }>; post: (p: string, b?: unknown) => PromiseLike<{ status: number; body: unknown }> }, orderId: number) {
  const pallet = await client.get(`/api/orders/${orderId}/pallets/1`);
  expect(pallet.status, JSON.stringify(pallet.body)).toBe(200);
  const runId = (pallet.body as { run_id: number }).run_id;
  const run = (await client.get(`/api/runs/${runId}`)).body as { deck: { positions: { order_id: number; loaded: boolean }[] } };
  for (const [i, p] of run.deck.positions.entries()) {
    if (p.order_id !== orderId || p.loaded) continue;
    const res = await client.post(`/api/runs/${runId}/positions/${i}/loaded`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  }
  return runId;
}
