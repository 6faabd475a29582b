import sharp from 'sharp';
import { expect } from 'vitest';
import { addDays, nextWorkingDay } from '../../shared/domain/business-calendar';
import { DEMO_CATALOGUES } from '../../seeds/02-catalogue';
import { makeUser } from './factories';
import { contractorWithEstimate, loadRunOf, merchantWithCatalogue, orderBody } from './order-scenario';
import { signIn } from './scenario';
import type { TestApp } from './test-app';

/**
 * A merchant and a contractor that trade with each other, with one record of every kind the API
 * names by id: site, schedule, estimate, orders (placed, with an offer, invoiced), quote request and
 * quote, products, roof system, lorry, slot, members and an invitation; a run today driven by the
 * merchant's driver with one order booked on it and one delivered from it (proof with signature and
 * photo, and the draft credit note its short packs raise). Two such pairs make "own" and "other
 * firm" for the access matrix.
 */
export async function tradingPair(t: TestApp, n: 0 | 1) {
  const m = await merchantWithCatalogue(t, DEMO_CATALOGUES[n]);
  const k = await contractorWithEstimate(t, m);
  const contractorOwner = await makeUser(t.db, k.organisationId, 'contractor_owner');
  const desk = await signIn(t.app, m.salesEmail);
  const yard = await signIn(t.app, m.dispatcherEmail);
  const placed = await k.c.post('/api/orders', orderBody(k, m));
  expect(placed.status, JSON.stringify(placed.body)).toBe(201);
  const offered = await k.c.post('/api/orders', orderBody(k, m));
  const proposal = await desk.post(`/api/orders/${offered.body.id}/proposals`, { revision: 1, message: 'A day later', proposed_date: addDays(t.config.calendar.today(), 9) });
  expect(proposal.status, JSON.stringify(proposal.body)).toBe(201);
  const billed = await k.c.post('/api/orders', orderBody(k, m));
  const confirmed = await desk.post(`/api/orders/${billed.body.id}/confirm`, {});
  expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(200);
  const invoice = await desk.post(`/api/orders/${billed.body.id}/invoice`);
  expect(invoice.status, JSON.stringify(invoice.body)).toBe(201);
  const lorry = await yard.post(`/api/branches/${m.branchId}/lorries`, { name: 'Rigid', registration: `MX-${n}RA`, payload_kg: 12000, pallet_slots: 10, has_crane: true, crane_max_kg: 1500 });
  expect(lorry.status, JSON.stringify(lorry.body)).toBe(201);
  const day = nextWorkingDay(addDays(t.config.calendar.today(), 6));
  const slot = await yard.post(`/api/branches/${m.branchId}/slots`, { lorry_id: lorry.body.id, date: day, time_window: '07:30-12:00' });
  expect(slot.status, JSON.stringify(slot.body)).toBe(201);
  const qr = await k.c.post('/api/quote-requests', { estimate_id: k.estimate.id, branch_ids: [m.branchId], requested_date: addDays(t.config.calendar.today(), 12), time_window: '07:00-11:00', delivery_method: 'ground' });
  expect(qr.status, JSON.stringify(qr.body)).toBe(201);
  const quote = await t.db('quotes').where({ quote_request_id: qr.body.id }).first();
  const [inv] = await t
    .db('invitations')
    .insert({
      organisation_id: m.organisationId,
      email: `pending.${n}@matrix.test`,
      role: 'merchant_sales',
      token_hash: `matrix-${n}`.padEnd(64, '0'),
      invited_by: null,
      expires_at: new Date(Date.now() + 86_400_000).toISOString(),
      created_at: new Date().toISOString(),
    })
    .returning('id');
  const memberOfMerchant = await makeUser(t.db, m.organisationId, 'merchant_sales');
  const memberOfContractor = await makeUser(t.db, k.organisationId, 'contractor_estimator');
  // A run today: one order booked on it, one loaded, sent out and delivered with a signature, a photo and a short pack.
  const today = t.config.calendar.today();
  const runLorry = await yard.post(`/api/branches/${m.branchId}/lorries`, { name: 'Crane rigid', registration: `MX-${n}RB`, payload_kg: 26000, pallet_slots: 26, has_crane: true, crane_max_kg: 2000 });
  expect(runLorry.status, JSON.stringify(runLorry.body)).toBe(201);
  const run = await yard.post(`/api/branches/${m.branchId}/slots`, { lorry_id: runLorry.body.id, date: today, time_window: '00:00-23:59', driver_id: m.driverId });
  expect(run.status, JSON.stringify(run.body)).toBe(201);
  const booked = await k.c.post('/api/orders', orderBody(k, m, { requested_date: today }));
  expect(booked.status, JSON.stringify(booked.body)).toBe(201);
  const bookedOn = await desk.post(`/api/orders/${booked.body.id}/confirm`, { slot_id: run.body.id });
  expect(bookedOn.status, JSON.stringify(bookedOn.body)).toBe(200);
  const dropped = await k.c.post('/api/orders', orderBody(k, m, { requested_date: today }));
  expect(dropped.status, JSON.stringify(dropped.body)).toBe(201);
  const droppedOn = await desk.post(`/api/orders/${dropped.body.id}/confirm`, { slot_id: run.body.id });
  expect(droppedOn.status, JSON.stringify(droppedOn.body)).toBe(200);
  await loadRunOf(yard, dropped.body.id);
  const out = await yard.post(`/api/orders/${dropped.body.id}/dispatch`);
  expect(out.status, JSON.stringify(out.body)).toBe(200);
  const sent = (droppedOn.body.lines as { id: number; reserved_quantity: number }[]).find((l) => l.reserved_quantity >= 2)!;
  const driver = await signIn(t.app, m.driverEmail);
  const signature = await sharp({ create: { width: 300, height: 120, channels: 3, background: '#ffffff' } })
    .png()
    .toBuffer();
  const photo = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#7a8c99' } })
    .jpeg()
    .toBuffer();
  const delivery = await driver.agent
    .post(`/api/orders/${dropped.body.id}/delivery`)
    .set('X-CSRF-Token', await driver.csrf())
    .field('receiver_name', 'Site office')
    .field('lines', JSON.stringify([{ line_id: sent.id, handed_over: sent.reserved_quantity - 1, short: 1, damaged: 0 }]))
    .attach('signature', signature, { filename: 'signature.png', contentType: 'image/png' })
    .attach('photos', photo, { filename: 'drop.jpg', contentType: 'image/jpeg' });
  expect(delivery.status, JSON.stringify(delivery.body)).toBe(200);
  expect(delivery.body.proof.credit_note_id, 'a short pack raises a draft credit note').not.toBeNull();
  const tileId = m.product('TRS-FL420-SG') ?? [...(await t.db('products').where({ organisation_id: m.organisationId }).pluck('id'))][0];
  return {
    m,
    k,
    contractorOwner,
    emails: {
      contractor_owner: contractorOwner.email,
      contractor_estimator: k.email,
      merchant_owner: m.ownerEmail,
      merchant_sales: m.salesEmail,
      merchant_dispatcher: m.dispatcherEmail,
      driver: m.driverEmail,
    },
    ids: {
      projectId: k.projectId as number,
      estimateId: k.estimate.id as number,
      orderId: placed.body.id as number,
      offeredOrderId: offered.body.id as number,
      confirmedOrderId: billed.body.id as number,
      proposalId: proposal.body.proposal_id as number,
      invoiceId: invoice.body.id as number,
      invoiceLineId: invoice.body.lines[0].id as number,
      orderLineId: placed.body.lines[0].id as number,
      runId: run.body.id as number,
      bookedOrderId: booked.body.id as number,
      deliveredOrderId: dropped.body.id as number,
      photoId: delivery.body.proof.photos[0].id as number,
      creditDraftId: delivery.body.proof.credit_note_id as number,
      quoteRequestId: qr.body.id as number,
      quoteId: quote.id as number,
      branchId: m.branchId,
      productId: tileId as number,
      systemId: m.systemId as number,
      lorryId: lorry.body.id as number,
      slotId: slot.body.id as number,
      driverId: m.driverId,
      invitationId: (inv as { id: number }).id,
      merchantMemberId: memberOfMerchant.userId,
      contractorMemberId: memberOfContractor.userId,
      merchantOrgId: m.organisationId,
      contractorOrgId: k.organisationId as number,
    },
  };
}
export type TradingPair = Awaited<ReturnType<typeof tradingPair>>;
