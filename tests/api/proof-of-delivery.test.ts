import sharp from 'sharp';
import { PDFParse } from 'pdf-parse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { orderDetailSchema } from '../../shared/schemas/order.schema';
import { creditNoteDraftSchema, deliveryProofSchema, driverDaySchema } from '../../shared/schemas/run.schema';
import { makeOrgWithUser } from '../setup/factories';
import { contractorWithEstimate, loadRunOf, merchantWithCatalogue, orderBody, type TestMerchant } from '../setup/order-scenario';
import { signIn } from '../setup/scenario';
import { createTestApp, type Client, type TestApp } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const TILE = 'TRS-FL420-SG';
let lorryNo = 0;
type Detail = ReturnType<typeof orderDetailSchema.parse>;

/** A crane lorry with a run today (by the business calendar) driven by the merchant's driver. */
async function runToday(m: TestMerchant) {
  const yard = await signIn(t.app, m.dispatcherEmail);
  const l = await yard.post(`/api/branches/${m.branchId}/lorries`, {
    registration: `RL-PD${String(++lorryNo).padStart(2, '0')}`,
    name: 'Crane rigid',
    payload_kg: 26000,
    pallet_slots: 26,
    has_crane: true,
    crane_max_kg: 2000,
  });
  expect(l.status, JSON.stringify(l.body)).toBe(201);
  const s = await yard.post(`/api/branches/${m.branchId}/slots`, { lorry_id: l.body.id, date: t.config.calendar.today(), time_window: '00:00-23:59' });
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  expect((await yard.patch(`/api/slots/${s.body.id}`, { driver_id: m.driverId })).status).toBe(200);
  return { yard, slotId: s.body.id as number };
}

/** An order from a new contractor, confirmed onto the run (tile line part-sent when `tilePacks` is given) and, unless `book` only, sent out. */
async function dropOnRun(m: TestMerchant, run: { yard: Client; slotId: number }, o: { method?: 'ground' | 'roof'; tilePacks?: number; dispatch?: boolean } = {}) {
  const k = await contractorWithEstimate(t, m);
  const placed = orderDetailSchema.parse((await k.c.post('/api/orders', orderBody(k, m, { requested_date: t.config.calendar.today(), delivery_method: o.method ?? 'ground' }))).body);
  const desk = await signIn(t.app, m.salesEmail);
  const tile = placed.lines.find((l) => l.sku === TILE)!;
  const confirm = await desk.post(`/api/orders/${placed.id}/confirm`, { slot_id: run.slotId, ...(o.tilePacks !== undefined ? { lines: [{ line_id: tile.id, quantity: o.tilePacks }] } : {}) });
  expect(confirm.status, JSON.stringify(confirm.body)).toBe(200);
  if (o.dispatch !== false) {
    await loadRunOf(run.yard, placed.id);
    expect((await run.yard.post(`/api/orders/${placed.id}/dispatch`)).status).toBe(200);
  }
  const order = orderDetailSchema.parse((await desk.get(`/api/orders/${placed.id}`)).body);
  return { k, desk, order };
}

const png = (w = 300, h = 120) =>
  sharp({ create: { width: w, height: h, channels: 3, background: '#ffffff' } })
    .png()
    .toBuffer();
const jpeg = () =>
  sharp({ create: { width: 1200, height: 800, channels: 3, background: '#7a8c99' } })
    .jpeg()
    .toBuffer();

/** A multipart delivery record from the phone. */
function multipart(c: Client, token: string, orderId: number, fields: Record<string, string>, files: { field: string; data: Buffer; name: string; type: string }[], key?: string) {
  let req = c.agent.post(`/api/orders/${orderId}/delivery`).set('X-CSRF-Token', token);
  if (key) req = req.set('Idempotency-Key', key);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  for (const f of files) req = req.attach(f.field, f.data, { filename: f.name, contentType: f.type });
  return req;
}

describe('proof of delivery: uploads are checked by their bytes, size and count', () => {
  it('refuses a .jpg that is really text, a 9 MB photo, seven photos and a signature that is not a PNG, and records nothing', async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const { order } = await dropOnRun(m, run);
    const driver = await signIn(t.app, m.driverEmail);
    const token = await driver.csrf();
    const fields = { receiver_name: 'Lowri Haskett' };

    const text = await multipart(driver, token, order.id, fields, [{ field: 'photos', data: Buffer.from('not a photo at all, only words\n'.repeat(40)), name: 'site.jpg', type: 'image/jpeg' }]);
    expect(text.status).toBe(422);
    expect(text.body.error.code).toBe('file_type_refused');
    expect(text.body.error.details[0]).toMatchObject({ path: 'photos.0' });
    expect(text.body.error.details[0].message).toMatch(/site\.jpg/);

    const big = Buffer.concat([await jpeg(), Buffer.alloc(9 * 1024 * 1024)]);
    const tooBig = await multipart(driver, token, order.id, fields, [{ field: 'photos', data: big, name: 'big.jpg', type: 'image/jpeg' }]);
    expect(tooBig.status).toBe(413);
    expect(tooBig.body.error.code).toBe('file_too_large');

    const photo = await jpeg();
    const seven = await multipart(
      driver,
      token,
      order.id,
      fields,
      Array.from({ length: 7 }, (_, i) => ({ field: 'photos', data: photo, name: `p${i}.jpg`, type: 'image/jpeg' })),
    );
    expect(seven.status).toBe(422);
    expect(seven.body.error.code).toBe('too_many_files');

    const jpegSignature = await multipart(driver, token, order.id, fields, [{ field: 'signature', data: photo, name: 'signature.png', type: 'image/png' }]);
    expect(jpegSignature.status).toBe(422);
    expect(jpegSignature.body.error.details[0]).toMatchObject({ path: 'signature' });

    expect((await t.db('orders').where({ id: order.id }).first()).status).toBe('on_the_road');
    expect(await t.db('delivery_proofs').where({ order_id: order.id })).toHaveLength(0);
  });

  it('accepts a WebP photo named .txt, because its bytes say it is an image', async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const { order } = await dropOnRun(m, run);
    const driver = await signIn(t.app, m.driverEmail);
    const webp = await sharp({ create: { width: 64, height: 64, channels: 3, background: '#335577' } })
      .webp()
      .toBuffer();
    const res = await multipart(driver, await driver.csrf(), order.id, { receiver_name: 'Site office' }, [{ field: 'photos', data: webp, name: 'notes.txt', type: 'text/plain' }]);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.proof.photos[0].content_type).toBe('image/webp');
  });
});

describe('proof of delivery: record, credit, who sees it', () => {
  it('records signature, photo, position and per-line outcomes; raises a draft credit note priced at the order; the contractor sees its own proof only', async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const { k, order } = await dropOnRun(m, run);
    const tile = order.lines.find((l) => l.sku === TILE)!;
    const other = order.lines.find((l) => l.sku !== TILE && l.reserved_quantity >= 2)!;
    const stockBefore = await t.db('branch_products').where({ branch_id: m.branchId, product_id: tile.product_id }).first();
    const driver = await signIn(t.app, m.driverEmail);
    const signature = await png();
    const photo = await jpeg();
    const lines = [
      { line_id: tile.id, handed_over: tile.reserved_quantity - 3, short: 1, damaged: 2 },
      { line_id: other.id, handed_over: other.reserved_quantity - 1, short: 1, damaged: 0 },
    ];
    const res = await multipart(
      driver,
      await driver.csrf(),
      order.id,
      { receiver_name: 'Lowri Haskett', note: 'Two packs cracked in the lift', lines: JSON.stringify(lines), position: JSON.stringify({ lat: 52.123456, lng: -1.654321, accuracy_m: 12 }) },
      [
        { field: 'signature', data: signature, name: 'signature.png', type: 'image/png' },
        { field: 'photos', data: photo, name: 'drop.jpg', type: 'image/jpeg' },
      ],
    );
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.status).toBe('delivered');
    const proof = deliveryProofSchema.parse(res.body.proof);
    expect(proof).toMatchObject({ receiver_name: 'Lowri Haskett', note: 'Two packs cracked in the lift', position: { lat: 52.123456, lng: -1.654321, accuracy_m: 12 } });
    expect(proof.signature_url).toBe(`/api/orders/${order.id}/delivery/signature`);
    expect(proof.photos).toHaveLength(1);
    expect(proof.lines.find((l) => l.line_id === tile.id)).toMatchObject({ sent: tile.reserved_quantity, handed_over: tile.reserved_quantity - 3, short: 1, damaged: 2 });
    // Lines not named were handed over whole.
    const untouched = order.lines.find((l) => l.reserved_quantity > 0 && l.id !== tile.id && l.id !== other.id)!;
    expect(proof.lines.find((l) => l.line_id === untouched.id)).toMatchObject({ handed_over: untouched.reserved_quantity, short: 0, damaged: 0 });

    // Stock: the hold ends; handed over and damaged packs left the branch, the short pack stays in it.
    const stockAfter = await t.db('branch_products').where({ branch_id: m.branchId, product_id: tile.product_id }).first();
    expect(stockBefore.reserved - stockAfter.reserved).toBe(tile.reserved_quantity);
    expect(stockBefore.on_hand - stockAfter.on_hand).toBe(tile.reserved_quantity - 1);

    // Draft credit note: (short + damaged) × the order's pack price, tax per line at the product's rate
    // (20 %, the UK standard rate of VAT — HMRC, "VAT rates"), rounded half up to the penny.
    expect(proof.credit_note_id).not.toBeNull();
    const desk = await signIn(t.app, m.salesEmail);
    const draft = creditNoteDraftSchema.parse((await desk.get(`/api/credit-note-drafts/${proof.credit_note_id}`)).body);
    const tileNet = 3 * tile.unit_price;
    const otherNet = 1 * other.unit_price;
    const vat = (net: number) => Math.round((net * 2000) / 10_000);
    expect(draft.status).toBe('draft');
    expect(draft.lines.map((l) => [l.sku, l.short, l.damaged, l.quantity, l.net, l.tax])).toEqual([
      [tile.sku, 1, 2, 3, tileNet, vat(tileNet)],
      [other.sku, 1, 0, 1, otherNet, vat(otherNet)],
    ]);
    expect(draft.subtotal).toBe(tileNet + otherNet);
    expect(draft.total).toBe(tileNet + otherNet + vat(tileNet) + vat(otherNet));
    expect((await desk.get('/api/credit-note-drafts')).body.drafts.map((d: { id: number }) => d.id)).toContain(draft.id);
    expect((await k.c.get(`/api/credit-note-drafts/${draft.id}`)).status).toBe(403);

    // The contractor sees the proof of its own order, with the photo and signature through the checked routes.
    const seen = deliveryProofSchema.parse((await k.c.get(`/api/orders/${order.id}/delivery`)).body);
    expect(seen.receiver_name).toBe('Lowri Haskett');
    const sig = await k.c.get(seen.signature_url!).buffer(true);
    expect(sig.status).toBe(200);
    expect(sig.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(sig.body as Buffer, signature)).toBe(0);
    const full = await k.c.get(seen.photos[0].url).buffer(true);
    expect(full.headers['content-type']).toBe('image/jpeg');
    expect(Buffer.compare(full.body as Buffer, photo)).toBe(0);
    const thumb = await k.c.get(seen.photos[0].thumbnail_url).buffer(true);
    expect(thumb.headers['content-type']).toBe('image/webp');
    const meta = await sharp(thumb.body as Buffer).metadata();
    expect(Math.max(meta.width!, meta.height!)).toBeLessThanOrEqual(320);

    // Anyone else: another contractor, another merchant's driver, another driver of the same merchant, or nobody signed in.
    const stranger = await signIn(t.app, (await makeOrgWithUser(t.db, 'contractor', 'contractor_owner')).email);
    const otherDriver = await signIn(t.app, (await (await import('../setup/factories')).makeUser(t.db, m.organisationId, 'driver')).email);
    for (const c of [stranger, otherDriver]) {
      expect((await c.get(`/api/orders/${order.id}/delivery`)).status).toBe(404);
      expect((await c.get(seen.photos[0].url)).status).toBe(404);
      expect((await c.get(seen.signature_url!)).status).toBe(404);
      expect((await c.get(`/api/orders/${order.id}/delivery-note.pdf`)).status).toBe(404);
    }
    const { default: request } = await import('supertest');
    expect((await request(t.app).get(seen.photos[0].url)).status).toBe(401);
    // No public copy: the files live in the database, and nothing under the client's folder serves them.
    expect((await request(t.app).get(`/uploads/${seen.photos[0].id}.jpg`)).status).not.toBe(200);

    // The contractor gets the delivery note with the signature by e-mail, as a PDF.
    const mail = await waitMail(k.email, /delivery note attached/);
    const pdf = mail.attachments.find((a) => a.contentType === 'application/pdf');
    expect(pdf).toBeDefined();
    const text = await pdfText(pdf!.content);
    expect(text).toMatch(/Received by\s*Lowri Haskett/);
    expect(text).toMatch(/Photo 1/);
  });

  it('issues the draft against the invoice: an invoice made from the delivery already leaves the short packs out, so only the damaged ones are credited', async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const { order } = await dropOnRun(m, run);
    const tile = order.lines.find((l) => l.sku === TILE)!;
    const driver = await signIn(t.app, m.driverEmail);
    const rec = await driver.post(`/api/orders/${order.id}/delivery`, { receiver_name: 'Site office', lines: [{ line_id: tile.id, handed_over: tile.reserved_quantity - 3, short: 1, damaged: 2 }] });
    expect(rec.status, JSON.stringify(rec.body)).toBe(200);
    const desk = await signIn(t.app, m.salesEmail);
    const draftId = rec.body.proof.credit_note_id as number;
    expect((await desk.post(`/api/credit-note-drafts/${draftId}/issue`)).body.error.code).toBe('not_invoiced');
    const invoice = await desk.post(`/api/orders/${order.id}/invoice`);
    expect(invoice.status).toBe(201);
    const tileLine = invoice.body.lines.find((l: { sku: string }) => l.sku === TILE);
    // Invoiced from the delivery: handed over and damaged packs (what left the lorry), not the short one.
    expect(tileLine.quantity).toBe(tile.reserved_quantity - 1);
    const issued = await desk.post(`/api/credit-note-drafts/${draftId}/issue`);
    expect(issued.status, JSON.stringify(issued.body)).toBe(200);
    expect(issued.body.status).toBe('issued');
    const after = (await desk.get(`/api/invoices/${invoice.body.id}`)).body;
    expect(after.credit_notes).toHaveLength(1);
    expect(after.credit_notes[0]).toMatchObject({ id: issued.body.credit_note_id, reason: 'shortage' });
    expect(after.credit_notes[0].lines).toEqual([expect.objectContaining({ invoice_line_id: tileLine.id, quantity: 2, net: 2 * tile.unit_price })]);
    expect((await desk.post(`/api/credit-note-drafts/${draftId}/issue`)).body.error.code).toBe('draft_closed');
  });

  it('records the older JSON body (received_by, delivered_quantity) and keeps its answer', async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const { order } = await dropOnRun(m, run);
    const tile = order.lines.find((l) => l.sku === TILE)!;
    const driver = await signIn(t.app, m.driverEmail);
    const res = await driver.post(`/api/orders/${order.id}/delivery`, { received_by: 'Site office', notes: 'Left by the gate', lines: [{ line_id: tile.id, delivered_quantity: tile.reserved_quantity - 1 }] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const detail = orderDetailSchema.parse(res.body);
    expect(detail.delivery).toMatchObject({ received_by: 'Site office', notes: 'Left by the gate' });
    expect(res.body.proof.lines.find((l: { line_id: number }) => l.line_id === tile.id)).toMatchObject({ handed_over: tile.reserved_quantity - 1, short: 1, damaged: 0 });
  });

  it('refuses outcomes that do not add up to the packs loaded, naming the line', async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const { order } = await dropOnRun(m, run);
    const tile = order.lines.find((l) => l.sku === TILE)!;
    const driver = await signIn(t.app, m.driverEmail);
    const res = await driver.post(`/api/orders/${order.id}/delivery`, { receiver_name: 'A', lines: [{ line_id: tile.id, handed_over: 1, short: 0, damaged: 0 }] });
    expect(res.status).toBe(422);
    expect(res.body.error.details[0]).toMatchObject({ path: 'lines.0' });
    expect(res.body.error.details[0].message).toMatch(new RegExp(`${TILE}.*${tile.reserved_quantity} packs loaded`));
    expect((await t.db('orders').where({ id: order.id }).first()).status).toBe('on_the_road');
  });
});

describe('a retried delivery (Idempotency-Key) is recorded once', () => {
  it('answers a repeat with the first answer, changes nothing, and refuses the same key with another body', async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const { k, order } = await dropOnRun(m, run);
    const tile = order.lines.find((l) => l.sku === TILE)!;
    const driver = await signIn(t.app, m.driverEmail);
    const token = await driver.csrf();
    const key = 'phone-4f1c2a9e-0001';
    const fields = { receiver_name: 'Lowri Haskett', lines: JSON.stringify([{ line_id: tile.id, handed_over: tile.reserved_quantity - 1, short: 1, damaged: 0 }]) };
    const files = [{ field: 'signature', data: await png(), name: 'signature.png', type: 'image/png' }];
    const first = await multipart(driver, token, order.id, fields, files, key);
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    const stock = await t.db('branch_products').where({ branch_id: m.branchId, product_id: tile.product_id }).first();
    const events = (await t.db('order_events').where({ order_id: order.id, kind: 'delivered' })).length;

    const again = await multipart(driver, token, order.id, fields, files, key);
    expect(again.status).toBe(200);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body).toEqual(first.body);
    expect(await t.db('delivery_proofs').where({ order_id: order.id })).toHaveLength(1);
    expect(await t.db('credit_note_drafts').where({ order_id: order.id })).toHaveLength(1);
    expect((await t.db('order_events').where({ order_id: order.id, kind: 'delivered' })).length).toBe(events);
    expect(await t.db('branch_products').where({ branch_id: m.branchId, product_id: tile.product_id }).first()).toEqual(stock);

    const changed = await multipart(driver, token, order.id, { ...fields, receiver_name: 'Someone else' }, files, key);
    expect(changed.status).toBe(422);
    expect(changed.body.error.code).toBe('idempotency_key_reused');
    // The key belongs to its user: the contractor's client cannot read the driver's answer with it.
    expect(
      (
        await k.c.agent
          .post(`/api/orders/${order.id}/delivery`)
          .set('X-CSRF-Token', await k.c.csrf())
          .set('Idempotency-Key', key)
          .send({ receiver_name: 'x' })
      ).status,
    ).toBe(403);
    // Without a key a repeat is refused by the order's stage, as before.
    expect((await driver.post(`/api/orders/${order.id}/delivery`, { receiver_name: 'Lowri Haskett' })).body.error.code).toBe('order_not_on_the_road');
  });

  it('does not keep a failed answer: the same key runs again once the order is on the road', async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const { order } = await dropOnRun(m, run, { dispatch: false });
    const driver = await signIn(t.app, m.driverEmail);
    const token = await driver.csrf();
    const send = () => driver.agent.post(`/api/orders/${order.id}/delivery`).set('X-CSRF-Token', token).set('Idempotency-Key', 'phone-retry-0002').send({ receiver_name: 'Lowri Haskett' });
    expect((await send()).status).toBe(409);
    await loadRunOf(run.yard, order.id);
    expect((await run.yard.post(`/api/orders/${order.id}/dispatch`)).status).toBe(200);
    expect((await send()).status).toBe(200);
    expect((await driver.agent.post(`/api/orders/${order.id}/delivery`).set('X-CSRF-Token', token).set('Idempotency-Key', 'bad key').send({ receiver_name: 'x' })).body.error.code).toBe('idempotency_key_invalid');
  });
});

describe('the same Idempotency-Key mechanism on placing, confirming and importing', () => {
  it('places one order, confirms it once and imports one schedule version however often each is retried with its key', async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    const place = () => k.c.agent.post('/api/orders').set('X-CSRF-Token', token).set('Idempotency-Key', 'place-7d1e-0001').send(orderBody(k, m));
    const token = await k.c.csrf();
    const first = await place();
    expect(first.status).toBe(201);
    const again = await place();
    expect(again.status).toBe(201);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body.id).toBe(first.body.id);
    expect(await t.db('orders').where({ contractor_organisation_id: k.organisationId })).toHaveLength(1);

    const desk = await signIn(t.app, m.salesEmail);
    const deskToken = await desk.csrf();
    const confirm = () => desk.agent.post(`/api/orders/${first.body.id}/confirm`).set('X-CSRF-Token', deskToken).set('Idempotency-Key', 'confirm-7d1e-0001').send({});
    expect((await confirm()).status).toBe(200);
    const replay = await confirm();
    expect(replay.status).toBe(200);
    expect(replay.headers['idempotent-replayed']).toBe('true');
    expect(await t.db('order_events').where({ order_id: first.body.id, kind: 'confirmed' })).toHaveLength(1);

    const versions = async () => (await t.db('schedules').where({ project_id: k.projectId })).length;
    const before = await versions();
    const csv = 'building,face,quantity,pitch_deg,rafter_mm,eaves_mm,left,right,top\nGarage,Front,1,35,4000,6000,verge,verge,ridge\n';
    const upload = () => k.c.agent.post(`/api/projects/${k.projectId}/schedule`).set('X-CSRF-Token', token).set('Idempotency-Key', 'import-7d1e-0001').set('Content-Type', 'text/csv').send(csv);
    expect((await upload()).status).toBe(201);
    expect((await upload()).headers['idempotent-replayed']).toBe('true');
    expect(await versions()).toBe(before + 1);
  });
});

describe('the driver’s day', () => {
  it('lists only the driver’s runs, drops in order, cautions once per run, accessories by product name, a maps link and the crane landing plan', async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const first = await dropOnRun(m, run, { method: 'roof' });
    const second = await dropOnRun(m, run, { method: 'ground' });
    const driver = await signIn(t.app, m.driverEmail);
    const day = driverDaySchema.parse((await driver.get('/api/driver/runs')).body);
    expect(day.date).toBe(t.config.calendar.today());
    expect(day.runs).toHaveLength(1);
    const r = day.runs[0];
    expect(r.drops.map((d) => [d.order_id, d.position])).toEqual([
      [first.order.id, 1],
      [second.order.id, 2],
    ]);
    // Each caution once, though both drops carry the general ones.
    expect(new Set(r.cautions).size).toBe(r.cautions.length);
    expect(r.cautions.some((c) => /lift plan/.test(c))).toBe(true);
    expect(r.cautions.some((c) => /ground level/.test(c))).toBe(true);
    expect(r.cautions_read_at).toBeNull();

    const drop = r.drops[0];
    expect(drop.maps_url).toBe(`geo:0,0?q=${encodeURIComponent('1–4 Ferncombe Mews, Tollerbeck')}`);
    const items = drop.pallets.flatMap((p) => p.items);
    const lineNames = new Set(first.order.lines.map((l) => l.description));
    for (const it of items) expect(lineNames, `${it.description} is a product of the order`).toContain(it.description);
    const RAW = ['clip', 'clips', 'battens', 'underlay_rolls', 'batten_nails', 'tile_nails', 'valley', 'ridge_tiles', 'hip_tiles'];
    for (const it of items) expect(RAW.includes(it.description) || /[_:]/.test(it.description), it.description).toBe(false);
    expect(items.some((i) => /clips/i.test(i.description) && i.unit === 'clip')).toBe(true);
    // Every accessory unit is on a pallet exactly once: the items add up to the packs sent × pack size.
    for (const l of first.order.lines.filter((x) => x.category !== 'tile' && x.reserved_quantity > 0)) {
      const onPallets = items.filter((i) => i.description === l.description).reduce((s, i) => s + i.quantity, 0);
      expect(onPallets, l.sku).toBe(l.reserved_quantity * l.pack_size);
    }
    // The crane drop lands each face's pallets on it, with the estimate's face index; the ground drop has no plan.
    expect(drop.landing_plan.map((f) => f.face)).toEqual(expect.arrayContaining(['Front', 'Back']));
    const front = drop.landing_plan.find((f) => f.face === 'Front')!;
    expect(front.estimate_face_index).toBe(first.k.estimate.result.faces.findIndex((f: { face: string }) => f.face === 'Front'));
    expect(front.tiles).toBe(
      drop.pallets
        .flatMap((p) => p.faces)
        .filter((f) => f.face === 'Front')
        .reduce((s, f) => s + f.tiles, 0),
    );
    expect(r.drops[1].landing_plan).toEqual([]);
    expect(r.status).toBe('on_the_road');

    // The yard's drop order decides, wherever it is set: the second booking first.
    await t.db('slot_bookings').where({ order_id: second.order.id }).update({ drop_position: 1 });
    await t.db('slot_bookings').where({ order_id: first.order.id }).update({ drop_position: 2 });
    const reordered = driverDaySchema.parse((await driver.get('/api/driver/runs')).body).runs[0].drops;
    expect(reordered.map((d) => [d.order_id, d.position])).toEqual([
      [second.order.id, 1],
      [first.order.id, 2],
    ]);

    // Cautions read: recorded once for this driver, refused to anyone else.
    const read = await driver.post(`/api/runs/${r.id}/cautions-read`);
    expect(read.status).toBe(200);
    expect((await driver.post(`/api/runs/${r.id}/cautions-read`)).body.read_at).toBe(read.body.read_at);
    expect(driverDaySchema.parse((await driver.get(`/api/driver/runs?date=${day.date}`)).body).runs[0].cautions_read_at).toBe(read.body.read_at);
    expect((await run.yard.post(`/api/runs/${r.id}/cautions-read`)).status).toBe(403);

    // Another driver: no runs, cannot ask for this driver's day, cannot acknowledge or record this run.
    const { makeUser } = await import('../setup/factories');
    const other = await signIn(t.app, (await makeUser(t.db, m.organisationId, 'driver')).email);
    expect(driverDaySchema.parse((await other.get('/api/driver/runs')).body).runs).toEqual([]);
    expect((await other.get(`/api/driver/runs?driver_id=${m.driverId}`)).status).toBe(403);
    expect((await other.post(`/api/runs/${r.id}/cautions-read`)).status).toBe(404);
    expect((await other.post(`/api/orders/${first.order.id}/delivery`, { receiver_name: 'x' })).status).toBe(403);
    // The dispatcher names the driver; another merchant's dispatcher finds no such driver.
    expect(driverDaySchema.parse((await run.yard.get(`/api/driver/runs?driver_id=${m.driverId}`)).body).runs).toHaveLength(1);
    const elsewhere = await merchantWithCatalogue(t);
    expect((await (await signIn(t.app, elsewhere.dispatcherEmail)).get(`/api/driver/runs?driver_id=${m.driverId}`)).status).toBe(404);
  });

  it('marks the faces a part-confirmed tile line leaves short, with the follow-up order and its date', async () => {
    const m = await merchantWithCatalogue(t);
    const run = await runToday(m);
    const { order, k, desk } = await dropOnRun(m, run, { tilePacks: 200, dispatch: false });
    const due = t.config.calendar.fromToday(9);
    const follow = await desk.post(`/api/orders/${order.id}/follow-up`, { requested_date: due });
    expect(follow.status).toBe(201);
    const driver = await signIn(t.app, m.driverEmail);
    const drop = driverDaySchema.parse((await driver.get('/api/driver/runs')).body).runs[0].drops[0];
    // The faces need each face's tiles × copies (the engine's figures); the 200 tiles sent fill the first face first.
    const faces = k.estimate.result.faces as { building: string; face: string; tiles: number; quantity: number }[];
    const need = faces.map((f) => ({ face: f.face, tiles: f.tiles * f.quantity }));
    let left = 200;
    const expected = need
      .map((f) => {
        const carried = Math.min(left, f.tiles);
        left -= carried;
        return { face: f.face, tiles_short: f.tiles - carried };
      })
      .filter((f) => f.tiles_short > 0);
    expect(drop.short_faces.map((f) => ({ face: f.face, tiles_short: f.tiles_short }))).toEqual(expected);
    expect(drop.short_faces[0]).toMatchObject({ follow_up_reference: follow.body.reference, due_date: due });

    // The delivery note, printable once booked, says what follows.
    const pdf = await driver.get(`/api/orders/${order.id}/delivery-note.pdf`).buffer(true);
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const text = await pdfText(pdf.body as Buffer);
    expect(text).toMatch(new RegExp(`Delivery note ${order.reference}`));
    expect(text).toMatch(/Received in good order by/);
    expect(text).toMatch(/To follow/);
    expect(text).toMatch(new RegExp(`short of ${expected.at(-1)!.tiles_short} tiles`));
    expect(text).toMatch(/Gate|Verge by plot 1/);
  });

  it('prints no delivery note before the order is booked onto a run', async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    const placed = (await k.c.post('/api/orders', orderBody(k, m))).body as Detail;
    const res = await k.c.get(`/api/orders/${placed.id}/delivery-note.pdf`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('not_booked');
  });
});

async function pdfText(data: Buffer): Promise<string> {
  const parser = new PDFParse({ data });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}

async function waitMail(address: string, subject: RegExp) {
  for (let i = 0; i < 50; i++) {
    const found = t.mail.messages.find((x) => x.to.includes(address) && subject.test(x.subject));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no e-mail to ${address} matching ${subject}`);
}
