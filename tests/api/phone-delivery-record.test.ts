import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { orderDetailSchema } from '../../shared/schemas/order.schema';
import { deliveryProofSchema } from '../../shared/schemas/run.schema';
import { contractorWithEstimate, merchantWithCatalogue, orderBody, type TestMerchant, loadRunOf } from '../setup/order-scenario';
import { signIn } from '../setup/scenario';
import { createTestApp, type TestApp } from '../setup/test-app';

/**
 * The record exactly as the phone's outbox sends it: multipart with every field as one JSON text
 * field named `data`, the signature PNG and the photos, and the Idempotency-Key made on the phone,
 * sent again when the first answer never reached the phone.
 */
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

async function droppedToday(m: TestMerchant) {
  const yard = await signIn(t.app, m.dispatcherEmail);
  const l = await yard.post(`/api/branches/${m.branchId}/lorries`, { registration: 'RL-PH01', name: 'Crane rigid', payload_kg: 26000, pallet_slots: 26, has_crane: true, crane_max_kg: 2000 });
  expect(l.status, JSON.stringify(l.body)).toBe(201);
  const s = await yard.post(`/api/branches/${m.branchId}/slots`, { lorry_id: l.body.id, date: t.config.calendar.today(), time_window: '00:00-23:59' });
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  expect((await yard.patch(`/api/slots/${s.body.id}`, { driver_id: m.driverId })).status).toBe(200);
  const k = await contractorWithEstimate(t, m);
  const placed = orderDetailSchema.parse((await k.c.post('/api/orders', orderBody(k, m, { requested_date: t.config.calendar.today(), delivery_method: 'ground' }))).body);
  const desk = await signIn(t.app, m.salesEmail);
  expect((await desk.post(`/api/orders/${placed.id}/confirm`, { slot_id: s.body.id })).status).toBe(200);
  await loadRunOf(yard, placed.id);
  expect((await yard.post(`/api/orders/${placed.id}/dispatch`)).status).toBe(200);
  return { k, order: orderDetailSchema.parse((await desk.get(`/api/orders/${placed.id}`)).body) };
}

describe("the phone's delivery record", () => {
  it('is read from the `data` field beside the files, and a retry with the same key records it once', async () => {
    const m = await merchantWithCatalogue(t);
    const { k, order } = await droppedToday(m);
    const driver = await signIn(t.app, m.driverEmail);
    const token = await driver.csrf();
    const line = order.lines.find((l) => l.reserved_quantity > 1)!;
    const data = {
      receiver_name: 'Ffion Castell',
      note: 'Left by the cabin',
      delivered_at: '2026-12-05T09:41:00.000Z',
      position: { lat: 52.5, lng: -1.9, accuracy_m: 15 },
      lines: [{ line_id: line.id, handed_over: line.reserved_quantity - 1, short: 1, damaged: 0 }],
    };
    const signature = await sharp({ create: { width: 300, height: 120, channels: 3, background: '#ffffff' } })
      .png()
      .toBuffer();
    const photo = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#7a8c99' } })
      .jpeg()
      .toBuffer();
    const key = randomUUID();
    const send = () =>
      driver.agent
        .post(`/api/orders/${order.id}/delivery`)
        .set('X-CSRF-Token', token)
        .set('Idempotency-Key', key)
        .field('data', JSON.stringify(data))
        .attach('signature', signature, { filename: 'signature.png', contentType: 'image/png' })
        .attach('photos', photo, { filename: 'photo-1.jpg', contentType: 'image/jpeg' });
    const first = await send();
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    const again = await send();
    expect(again.status, JSON.stringify(again.body)).toBe(200);
    expect(again.body).toEqual(first.body);

    const proof = deliveryProofSchema.parse((await k.c.get(`/api/orders/${order.id}/delivery`)).body);
    expect(proof).toMatchObject({ receiver_name: 'Ffion Castell', note: 'Left by the cabin', delivered_at: '2026-12-05T09:41:00.000Z', position: { lat: 52.5, lng: -1.9, accuracy_m: 15 } });
    expect(proof.signature_url).not.toBeNull();
    expect(proof.photos).toHaveLength(1);
    expect(proof.lines.find((l) => l.line_id === line.id)).toMatchObject({ handed_over: line.reserved_quantity - 1, short: 1, damaged: 0 });
    // One proof, one signature, one photo: the retry stored nothing twice.
    const proofs = await t.db('delivery_proofs').where({ order_id: order.id });
    expect(proofs).toHaveLength(1);
    const files = await t.db('delivery_files').where({ proof_id: proofs[0].id }).select('kind');
    expect(files.map((f: { kind: string }) => f.kind).sort()).toEqual(['photo', 'signature']);
  });

  it('names the `data` field when it is not a JSON object, and records nothing', async () => {
    const m = await merchantWithCatalogue(t);
    const { order } = await droppedToday(m);
    const driver = await signIn(t.app, m.driverEmail);
    const res = await driver.agent
      .post(`/api/orders/${order.id}/delivery`)
      .set('X-CSRF-Token', await driver.csrf())
      .field('data', '{receiver_name: Ffion')
      .attach('photos', Buffer.from([0xff, 0xd8, 0xff]), { filename: 'a.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(422);
    expect(res.body.error.details).toContainEqual(expect.objectContaining({ path: 'data' }));
    expect((await signIn(t.app, m.salesEmail).then((d) => d.get(`/api/orders/${order.id}`))).body.status).toBe('on_the_road');
  });
});
