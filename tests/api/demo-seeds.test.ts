import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { nextWorkingDay } from '../../shared/domain/business-calendar';
import { orderListSchema } from '../../shared/schemas/order.schema';
import { runDaySchema, type Run } from '../../shared/schemas/run.schema';
import { runSeeds } from '../../server/db/seed-runner';
import { DEMO_PASSWORD } from '../../seeds/01-demo';
import { DEMO_CATALOGUES } from '../../seeds/02-catalogue';
import { Client, createTestApp, type TestApp } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
  await runSeeds(t.db);
});
afterAll(async () => t.close());

const HELD = ['confirmed', 'on_the_road'];

async function demoClient(email: string) {
  const c = new Client(t.app);
  expect((await c.login(email, DEMO_PASSWORD)).status).toBe(200);
  return c;
}

describe('the demo seeds on a fresh database', () => {
  it('give both demo desks an order book in every stage, with quote requests waiting', async () => {
    const statuses = (await t.db('orders').select('status')).map((r) => r.status as string);
    expect(statuses.length).toBeGreaterThanOrEqual(10);
    // The order book and the yards' runs for today and the next working days.
    expect(statuses.length).toBeLessThanOrEqual(24);
    for (const stage of ['sent', 'changes_offered', 'confirmed', 'on_the_road', 'delivered', 'turned_down']) expect(statuses, stage).toContain(stage);
    const merchants = await t.db('orders').distinct('merchant_organisation_id');
    expect(merchants.length).toBe(2);
    const asked = await t.db('quotes').where({ status: 'asked' }).count({ n: '*' }).first();
    expect(Number(asked?.n)).toBeGreaterThanOrEqual(1);
    const answered = await t.db('quotes').where({ status: 'answered' }).count({ n: '*' }).first();
    expect(Number(answered?.n)).toBeGreaterThanOrEqual(1);
  });

  it('leave the desk a confirmed order with back-ordered packs to start a follow-up from', async () => {
    const owed = await t.db('order_lines as l').join('orders as o', 'o.id', 'l.order_id').where('o.status', 'confirmed').where('l.back_order_quantity', '>', 0).first('o.id');
    expect(owed).toBeDefined();
    const desk = await demoClient('sales@demo.test');
    const detail = (await desk.get(`/api/orders/${owed.id}`)).body as { allowed_actions: string[]; back_ordered_packs: number };
    expect(detail.back_ordered_packs).toBeGreaterThan(0);
    expect(detail.allowed_actions).toContain('start_follow_up');
  });

  it('hold at each branch exactly the packs its confirmed and loaded orders reserve, and never more than it has', async () => {
    // Stock on hand less what is promised is what can still be sold (common practice in stock keeping).
    const stock = await t.db('branch_products').select('branch_id', 'product_id', 'on_hand', 'reserved');
    const held = (await t
      .db('order_lines as l')
      .join('orders as o', 'o.id', 'l.order_id')
      .whereIn('o.status', HELD)
      .groupBy('o.branch_id', 'l.product_id')
      .select('o.branch_id', 'l.product_id')
      .sum({ packs: 'l.reserved_quantity' })) as { branch_id: number; product_id: number; packs: number | string }[];
    const heldOf = new Map(held.map((h) => [`${h.branch_id}:${h.product_id}`, Number(h.packs)]));
    let reservedSomething = false;
    for (const s of stock) {
      expect(s.reserved, `branch ${s.branch_id} product ${s.product_id}`).toBe(heldOf.get(`${s.branch_id}:${s.product_id}`) ?? 0);
      expect(s.on_hand - s.reserved).toBeGreaterThanOrEqual(0);
      if (s.reserved > 0) reservedSomething = true;
    }
    expect(reservedSomething).toBe(true);
    // Orders not yet confirmed, or closed, hold nothing.
    const stray = await t.db('order_lines as l').join('orders as o', 'o.id', 'l.order_id').whereNotIn('o.status', HELD).where('l.reserved_quantity', '>', 0).count({ n: '*' }).first();
    expect(Number(stray?.n)).toBe(0);
    // A confirmed line holds what the desk agreed to send.
    const lines = await t.db('order_lines as l').join('orders as o', 'o.id', 'l.order_id').where('o.status', 'confirmed').select('l.confirmed_quantity', 'l.reserved_quantity');
    for (const l of lines) expect(l.reserved_quantity).toBe(l.confirmed_quantity);
  });

  it('take what was handed over off the shelf: on hand is the seeded count less the packs delivered', async () => {
    const rows = await t
      .db('branch_products as bp')
      .join('branches as b', 'b.id', 'bp.branch_id')
      .join('organisations as m', 'm.id', 'b.organisation_id')
      .join('products as p', 'p.id', 'bp.product_id')
      .select('bp.branch_id', 'bp.product_id', 'bp.on_hand', 'b.name as branch', 'm.name as merchant', 'p.sku');
    const delivered = (await t
      .db('order_lines as l')
      .join('orders as o', 'o.id', 'l.order_id')
      .where('o.status', 'delivered')
      .groupBy('o.branch_id', 'l.product_id')
      .select('o.branch_id', 'l.product_id')
      .sum({ packs: 'l.delivered_quantity' })) as { branch_id: number; product_id: number; packs: number | string }[];
    const out = new Map(delivered.map((d) => [`${d.branch_id}:${d.product_id}`, Number(d.packs)]));
    expect([...out.values()].some((v) => v > 0)).toBe(true);
    for (const r of rows) {
      const m = DEMO_CATALOGUES.find((c) => c.organisation === r.merchant)!;
      const factor = m.branches.find((b) => b.name === r.branch)!.stockFactor;
      const seeded = Math.round(m.stock[r.sku][0] * factor);
      expect(r.on_hand, `${r.sku} at ${r.branch}`).toBe(seeded - (out.get(`${r.branch_id}:${r.product_id}`) ?? 0));
    }
  });

  it('book every lorry run within its payload and pallet slots, on a slot of the order’s own branch, today or later', async () => {
    // Payloads are set below the legal gross weights of Great Britain rigid lorries (Road Vehicles
    // (Authorised Weight) Regulations 1998: 18,000 kg on two axles, 26,000 kg on three) less their own weight.
    const slots = await t
      .db('delivery_slots as s')
      .join('lorries as l', 'l.id', 's.lorry_id')
      .select('s.id', 's.date', 's.branch_id', 's.booked_kg', 's.booked_pallets', 'l.payload_kg', 'l.pallet_slots', 'l.registration');
    const bookings = await t.db('slot_bookings as sb').join('orders as o', 'o.id', 'sb.order_id').select('sb.slot_id', 'sb.weight_kg', 'sb.pallets', 'o.branch_id', 'o.status');
    expect(bookings.length).toBeGreaterThanOrEqual(4);
    const today = new Date().toISOString().slice(0, 10);
    for (const s of slots) {
      const mine = bookings.filter((b) => b.slot_id === s.id);
      const kg = mine.reduce((sum, b) => sum + Number(b.weight_kg), 0);
      const pallets = mine.reduce((sum, b) => sum + b.pallets, 0);
      expect(Number(s.booked_kg)).toBeCloseTo(kg, 1);
      expect(s.booked_pallets).toBe(pallets);
      expect(Number(s.booked_kg), `${s.registration} ${s.date}`).toBeLessThanOrEqual(s.payload_kg);
      expect(s.booked_pallets, `${s.registration} ${s.date}`).toBeLessThanOrEqual(s.pallet_slots);
      for (const b of mine) expect(b.branch_id).toBe(s.branch_id);
      if (mine.length > 0) expect(s.date >= today).toBe(true);
    }
    // A lorry on the road, or back from a drop, had a driver on its run.
    const gone = await t
      .db('slot_bookings as sb')
      .join('orders as o', 'o.id', 'sb.order_id')
      .join('delivery_slots as s', 's.id', 'sb.slot_id')
      .whereIn('o.status', ['on_the_road', 'delivered'])
      .select('s.driver_user_id');
    expect(gone.length).toBeGreaterThanOrEqual(2);
    for (const g of gone) expect(g.driver_user_id).not.toBeNull();
  });

  it('number each merchant’s invoices 1 to n without gaps, one of them paid in full', async () => {
    // A VAT invoice carries a unique number that follows on from the last one (GOV.UK, "VAT record
    // keeping: VAT invoices", gov.uk/vat-record-keeping/vat-invoices; from memory).
    const invoices = await t.db('invoices').select('merchant_organisation_id', 'number', 'total', 'paid', 'credited', 'order_id');
    const byMerchant = new Map<number, number[]>();
    for (const i of invoices) byMerchant.set(i.merchant_organisation_id, [...(byMerchant.get(i.merchant_organisation_id) ?? []), i.number]);
    expect(byMerchant.size).toBe(2);
    for (const numbers of byMerchant.values()) expect([...numbers].sort((a, b) => a - b)).toEqual(numbers.map((_, i) => i + 1));
    const paid = invoices.filter((i) => i.paid > 0);
    expect(paid.length).toBe(1);
    expect(paid[0].paid).toBe(paid[0].total - paid[0].credited);
    const payments = await t.db('payments').where({ status: 'succeeded' }).select('invoice_id', 'amount');
    expect(payments.map((p) => p.amount)).toEqual([paid[0].total]);
    // Each invoice's total is its lines' total, and only delivered or confirmed orders are invoiced.
    for (const i of invoices) {
      const order = await t.db('orders').where({ id: i.order_id }).first();
      expect(['confirmed', 'on_the_road', 'delivered']).toContain(order.status);
    }
    const sums = (await t.db('invoice_lines').groupBy('invoice_id').select('invoice_id').sum({ total: 'total' })) as { invoice_id: number; total: number | string }[];
    const all = await t.db('invoices').select('id', 'total');
    for (const inv of all) expect(Number(sums.find((s) => s.invoice_id === inv.id)?.total)).toBe(inv.total);
  });

  it('give every order a timeline that starts with its sending and follows its stage', async () => {
    const orders = await t.db('orders').select('id', 'status', 'subtotal');
    const expected: Record<string, string[]> = {
      sent: ['placed'],
      changes_offered: ['placed', 'changes_offered'],
      agreed: ['placed', 'changes_offered', 'changes_accepted'],
      confirmed: ['placed', 'confirmed'],
      on_the_road: ['placed', 'confirmed', 'dispatched'],
      delivered: ['placed', 'confirmed', 'dispatched', 'delivered', 'invoiced'],
      turned_down: ['placed', 'turned_down'],
    };
    for (const o of orders) {
      const kinds = (await t.db('order_events').where({ order_id: o.id }).orderBy('id').select('kind')).map((e) => e.kind as string);
      expect(kinds[0]).toBe('placed');
      for (const k of expected[o.status] ?? ['placed']) expect(kinds, `order ${o.id} (${o.status})`).toContain(k);
      const lines = await t.db('order_lines').where({ order_id: o.id }).sum({ total: 'total' }).first();
      expect(Number(lines?.total)).toBe(o.subtotal);
    }
    const open = await t.db('order_proposals as p').join('orders as o', 'o.id', 'p.order_id').where('p.status', 'open').select('o.status');
    for (const p of open) expect(p.status).toBe('changes_offered');
  });

  it('show the desk its seeded orders through the API, and leave everything as it is when run again', async () => {
    const desk = await demoClient('sales@demo.test');
    const book = orderListSchema.parse((await desk.get('/api/orders?page_size=100').expect(200)).body);
    expect(book.total).toBeGreaterThanOrEqual(8);
    expect(book.orders.every((o) => o.branch.merchant.name === 'Tollerbeck Roofing Supplies')).toBe(true);
    const quotes = (await desk.get('/api/quote-requests').expect(200)).body as { quote_requests: { quotes: { status: string }[] }[] };
    expect(quotes.quote_requests.some((r) => r.quotes.some((q) => q.status === 'asked'))).toBe(true);

    const count = async (table: string) => Number((await t.db(table).count({ n: '*' }).first())?.n);
    const before = await Promise.all(['orders', 'order_events', 'invoices', 'quote_requests', 'slot_bookings', 'projects', 'estimates'].map(count));
    const stock = await t.db('branch_products').orderBy(['branch_id', 'product_id']).select('on_hand', 'reserved');
    await runSeeds(t.db);
    expect(await Promise.all(['orders', 'order_events', 'invoices', 'quote_requests', 'slot_bookings', 'projects', 'estimates'].map(count))).toEqual(before);
    expect(await t.db('branch_products').orderBy(['branch_id', 'product_id']).select('on_hand', 'reserved')).toEqual(stock);
  });

  it('hold a delivered drop with its proof: receiver, a signature and a photo made for the demo, served through the checked routes', async () => {
    const proofs = await t.db('delivery_proofs as p').join('delivery_files as f', 'f.proof_id', 'p.id').select('p.order_id', 'f.kind');
    const withBoth = [...new Set(proofs.map((p) => p.order_id as number))].filter((id) => proofs.some((p) => p.order_id === id && p.kind === 'signature') && proofs.some((p) => p.order_id === id && p.kind === 'photo'));
    expect(withBoth.length).toBeGreaterThanOrEqual(1);
    const contractor = await demoClient('estimator@demo.test');
    const proof = (await contractor.get(`/api/orders/${withBoth[0]}/delivery`)).body;
    expect(proof.receiver_name).toBe('Gethin Marlow');
    expect((await contractor.get(proof.signature_url)).headers['content-type']).toBe('image/png');
    expect((await contractor.get(proof.photos[0].url)).headers['content-type']).toBe('image/jpeg');
    expect((await (await demoClient('contractor2@demo.test')).get(`/api/orders/${withBoth[0]}/delivery`)).status).toBe(404);
  });

  it('give every demo branch runs today or on the next working days: two drops on one lorry, a crane drop, a run loaded, one half loaded, a face short', async () => {
    const today = t.config.calendar.today();
    const runs: Run[] = [];
    for (const email of ['dispatch@demo.test', 'dispatch2@demo.test']) {
      const yard = await demoClient(email);
      const me = (await yard.get('/api/auth/me')).body as { organisation: { id: number } };
      const branches = await t.db('branches').where({ organisation_id: me.organisation.id }).select('id');
      expect(branches.length).toBe(2);
      for (const b of branches) {
        const found: Run[] = [];
        for (let d = today, n = 0; n < 3; d = nextWorkingDay(d), n++) {
          const res = await yard.get(`/api/branches/${b.id}/runs?date=${d}`);
          expect(res.status).toBe(200);
          found.push(...runDaySchema.parse(res.body).filter((r) => r.drops.length > 0));
        }
        expect(found.length, `branch ${b.id}`).toBeGreaterThan(0);
        runs.push(...found);
      }
    }
    expect(runs.some((r) => r.drops.length >= 2)).toBe(true);
    expect(runs.some((r) => r.drops.some((d) => d.delivery_method === 'roof') && r.lorry.has_crane)).toBe(true);
    expect(runs.some((r) => r.status === 'loaded' && r.loaded_count === r.pallets)).toBe(true);
    expect(runs.some((r) => r.date === today && r.loaded_count > 0 && r.loaded_count < r.pallets)).toBe(true);
    expect(runs.some((r) => r.drops.some((d) => d.short && d.status === 'confirmed'))).toBe(true);
    expect(runs.some((r) => r.drops.some((d) => d.status === 'delivered'))).toBe(true);
  });
});

describe('the demo seeds on a database seeded from an earlier demo', () => {
  it('give a catalogue seeded before the fittings the demo products and system parts it lacks, and leave what it has', async () => {
    const [TOLLERBECK] = DEMO_CATALOGUES;
    const org = (await t.db('organisations').where({ name: TOLLERBECK.organisation, kind: 'merchant' }).first()) as { id: number };
    const ofOrg = () => t.db('roof_systems').where({ organisation_id: org.id }).select('id');
    // As an earlier demo left it: no product under the flashing's SKU and no flashing part in any system.
    const old = (await t.db('products').where({ organisation_id: org.id, sku: 'TRS-FLR-6M' }).first()) as { id: number };
    await t.db('roof_system_components').where({ role: 'flashing' }).whereIn('roof_system_id', ofOrg()).delete();
    await t.db('products').where({ id: old.id }).update({ sku: 'TRS-OLD-FLASHING' });
    const products = async () => Number((await t.db('products').where({ organisation_id: org.id }).count({ n: '*' }).first())?.n);
    const before = await products();
    const stock = await t.db('branch_products').orderBy(['branch_id', 'product_id']).select('branch_id', 'product_id', 'pack_price', 'on_hand', 'reserved');
    const parts = Number((await t.db('roof_system_components').whereIn('roof_system_id', ofOrg()).count({ n: '*' }).first())?.n);

    await runSeeds(t.db);

    const added = (await t.db('products').where({ organisation_id: org.id, sku: 'TRS-FLR-6M' }).first()) as { id: number };
    expect(added.id).not.toBe(old.id);
    expect(await products()).toBe(before + 1);
    // Sold at both branches at the demo price and each branch's factor (pence, rounded).
    const prices = (await t.db('branch_products').where({ product_id: added.id }).select('pack_price')).map((r) => r.pack_price as number);
    expect(prices.sort((a, b) => a - b)).toEqual(TOLLERBECK.branches.map((b) => Math.round(TOLLERBECK.prices['TRS-FLR-6M'] * b.priceFactor)).sort((a, b) => a - b));
    // Every demo system at every branch has its flashing again; nothing else was added or changed.
    const flashing = await t.db('roof_system_components').where({ role: 'flashing' }).whereIn('roof_system_id', ofOrg()).select('product_id');
    expect(flashing.map((r) => r.product_id)).toEqual(Array(TOLLERBECK.branches.length * TOLLERBECK.systems.length).fill(added.id));
    expect(Number((await t.db('roof_system_components').whereIn('roof_system_id', ofOrg()).count({ n: '*' }).first())?.n)).toBe(parts + flashing.length);
    const after = await t.db('branch_products').whereNot({ product_id: added.id }).orderBy(['branch_id', 'product_id']).select('branch_id', 'product_id', 'pack_price', 'on_hand', 'reserved');
    expect(after).toEqual(stock);
  });
});
