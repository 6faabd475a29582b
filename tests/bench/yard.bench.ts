/**
 * Yard benchmark: a branch's day of 40 runs (lorries of 26 pallet positions on a 13.6 m deck, one to
 * four drops each, up to 26 pallets a run, some pallets ticked loaded) in a temporary SQLite file. The
 * day-plan endpoint (`GET /api/branches/:id/runs?date=`, deck plans and pick lists, signed in) is put
 * under concurrent load with autocannon against the whole app in this process, with a bare Express
 * JSON route in the same run for comparison; then the loading-sheet PDF of the fullest run is made
 * several times. Prints p50/p99 and requests per second and ends with one JSON line.
 * Target: day-plan p99 within 3× of the bare route.
 *
 *   npm run bench:yard [-- --seconds=10]
 */
import { mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import autocannon from 'autocannon';
import express from 'express';
import pino from 'pino';
import { createApp } from '../../server/app';
import { hashPassword } from '../../server/auth/passwords';
import { loadConfig } from '../../server/config/env';
import { createDb, migrateLatest, type Db } from '../../server/db/knex';

const RUNS = 40;
const MAX_PALLETS = 26;
const CONNECTIONS = 10;
const TARGET_RATIO = 3;
const PDF_REPEATS = 5;
const SECONDS = Number(process.argv.find((a) => a.startsWith('--seconds='))?.split('=')[1] ?? 10);
const PASSWORD = 'bench-password-123';

function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const idOf = (row: unknown) => (typeof row === 'object' && row !== null ? (row as { id: number }).id : (row as number));

/** One merchant branch with 20 lorries, two runs each on the day (40 runs), filled with confirmed orders. */
async function seedDay(db: Db, date: string) {
  const now = new Date().toISOString();
  const rand = rng(11);
  const hash = await hashPassword(PASSWORD);
  const merchant = idOf((await db('organisations').insert({ name: 'Benchmark Roofing Supplies', kind: 'merchant', created_at: now }).returning('id'))[0]);
  const branch = idOf((await db('branches').insert({ organisation_id: merchant, name: 'Bench Yard', address: '1 Bench Road', town: 'Benchton', created_at: now }).returning('id'))[0]);
  const yard = idOf((await db('users').insert({ organisation_id: merchant, email: 'yard@bench.test', name: 'Bench Yard', role: 'merchant_dispatcher', password_hash: hash, created_at: now }).returning('id'))[0]);
  const driver = idOf((await db('users').insert({ organisation_id: merchant, email: 'driver@bench.test', name: 'Bench Driver', role: 'driver', password_hash: hash, created_at: now }).returning('id'))[0]);
  const contractor = idOf((await db('organisations').insert({ name: 'Bench Contractor Roofing', kind: 'contractor', created_at: now }).returning('id'))[0]);
  const project = idOf((await db('projects').insert({ organisation_id: contractor, name: 'Bench site', site_address: '2 Bench Lane', created_at: now, updated_at: now }).returning('id'))[0]);
  const products = [] as number[];
  for (const [sku, category, kg] of [
    ['BEN-TILE', 'tile', 4.4],
    ['BEN-RIDGE', 'ridge', 5],
    ['BEN-BATTEN', 'batten', 2.2],
  ] as const) {
    products.push(
      idOf((await db('products').insert({ organisation_id: merchant, sku, name: sku, category, unit: 'piece', pack_size: 1, pack_weight_kg: kg, technical: '{}', created_at: now, updated_at: now }).returning('id'))[0]),
    );
  }
  const site = JSON.stringify({
    name: 'Bench site',
    site_address: '2 Bench Lane, Benchton',
    site_postcode: 'BE1 1NC',
    contact_name: 'Site agent',
    contact_phone: '07700 900 000',
    vehicle_access: 'any',
    crane_lift: 'allowed',
    overhead_lines: 'none',
    set_down_place: 'By the cabin',
    access_notes: 'Gate code at the office',
  });
  let runs = 0;
  let pallets = 0;
  await db.transaction(async (trx) => {
    for (let l = 0; l < RUNS / 2; l++) {
      const lorry = idOf(
        (
          await trx('lorries')
            .insert({
              organisation_id: merchant,
              branch_id: branch,
              registration: `BN${String(l).padStart(2, '0')} YRD`,
              name: 'Trailer',
              payload_kg: 26_000,
              pallet_slots: MAX_PALLETS,
              has_crane: l % 2 === 0,
              crane_max_kg: l % 2 === 0 ? 1_250 : null,
              deck_length_mm: 13_600,
              deck_width_mm: 2450,
              created_at: now,
              updated_at: now,
            })
            .returning('id')
        )[0],
      );
      for (const window of ['07:30-12:00', '12:30-16:30']) {
        const slot = idOf(
          (
            await trx('delivery_slots')
              .insert({ organisation_id: merchant, branch_id: branch, lorry_id: lorry, date, time_window: window, driver_user_id: driver, booked_kg: 0, booked_pallets: 0, created_at: now, updated_at: now })
              .returning('id')
          )[0],
        );
        runs++;
        const drops = 1 + Math.floor(rand() * 4);
        let room = 14 + Math.floor(rand() * (MAX_PALLETS - 13));
        let slotKg = 0;
        let slotPallets = 0;
        for (let d = 0; d < drops && room > 0; d++) {
          const count = d === drops - 1 ? room : Math.max(1, Math.floor(room / (drops - d)));
          room -= count;
          const method = l % 2 === 0 && d % 2 === 1 ? 'roof' : 'ground';
          const order = idOf(
            (
              await trx('orders')
                .insert({
                  contractor_organisation_id: contractor,
                  merchant_organisation_id: merchant,
                  branch_id: branch,
                  project_id: project,
                  status: 'confirmed',
                  revision: 1,
                  requested_date: date,
                  delivery_method: method,
                  po_reference: `PO-${slot}-${d}`,
                  notes: '',
                  site_name: 'Bench site',
                  site,
                  subtotal: 100_000,
                  placed_at: now,
                  updated_at: now,
                })
                .returning('id')
            )[0],
          );
          const plan = Array.from({ length: count }, (_, i) => {
            const tiles = i === 0 ? 0 : 180;
            return {
              n: i + 1,
              kind: i === 0 ? 'accessories' : 'tiles',
              tiles,
              weight_kg: i === 0 ? 180 + Math.round(rand() * 300) : Math.round((tiles * 4.4 + 25) * 10) / 10,
              faces: i === 0 ? [] : [{ building: `Plot ${d + 1}`, face: i % 2 ? 'Front' : 'Back', tiles }],
              items: i === 0 ? [{ item: 'battens', quantity: 60, weight_kg: 132 }] : [],
            };
          });
          const kg = plan.reduce((s, p) => s + p.weight_kg, 0);
          slotKg += kg;
          slotPallets += count;
          pallets += count;
          await trx('order_lines').insert(
            products.map((p, i) => ({
              order_id: order,
              position: i + 1,
              product_id: p,
              sku: ['BEN-TILE', 'BEN-RIDGE', 'BEN-BATTEN'][i],
              description: 'Bench product',
              category: ['tile', 'ridge', 'batten'][i],
              unit: 'piece',
              pack_size: 1,
              pack_weight_kg: 4.4,
              quantity: 100,
              confirmed_quantity: 100,
              back_order_quantity: 0,
              reserved_quantity: 100,
              unit_price: 100,
              total: 10_000,
              status: 'agreed',
            })),
          );
          await trx('slot_bookings').insert({
            order_id: order,
            slot_id: slot,
            weight_kg: kg,
            pallets: count,
            heaviest_pallet_kg: Math.max(...plan.map((p) => p.weight_kg)),
            plan: JSON.stringify({ pallets: plan }),
            booked_by: yard,
            booked_at: now,
          });
          for (const p of plan) if (rand() < 0.4) await trx('run_loaded_pallets').insert({ slot_id: slot, order_id: order, pallet: p.n, loaded_by: yard, loaded_at: now });
        }
        await trx('delivery_slots').where('id', slot).update({ booked_kg: slotKg, booked_pallets: slotPallets });
      }
    }
  });
  await db.raw('analyze');
  return { branch, runs, pallets };
}

function listen(app: express.Express): Promise<Server> {
  return new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
}

async function signIn(base: string): Promise<string> {
  const first = await fetch(`${base}/api/auth/csrf`);
  const cookie = (first.headers.get('set-cookie') ?? '').split(';')[0];
  const { token } = (await first.json()) as { token: string };
  const res = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': token, cookie },
    body: JSON.stringify({ email: 'yard@bench.test', password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`);
  return (res.headers.get('set-cookie') ?? cookie).split(';')[0];
}

function load(url: string, path: string, headers: Record<string, string>): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => {
    autocannon({ url: `${url}${path}`, connections: CONNECTIONS, duration: SECONDS, headers }, (err, result) => (err ? reject(err) : resolve(result)));
  });
}

async function main() {
  const dir = mkdtempSync(join(tmpdir(), 'ridgeload-bench-'));
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dir, LOGIN_RATE_LIMIT: '1000' });
  const db = createDb(config.databaseFile);
  try {
    await migrateLatest(db);
    const date = config.calendar.today();
    const { branch, runs, pallets } = await seedDay(db, date);
    console.log(`seeded a branch day of ${runs} runs with ${pallets} pallets on ${date}`);

    const mailer = { send: async () => {}, close: () => {} };
    const app = createApp({ config, db, mailer, logger: pino({ level: 'silent' }) });
    const server = await listen(app);
    const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    const cookie = await signIn(base);
    const bare = express();
    bare.get('/bare', (_req, res) => {
      res.json([]);
    });
    const bareServer = await listen(bare);
    const bareBase = `http://127.0.0.1:${(bareServer.address() as AddressInfo).port}`;

    const dayPath = `/api/branches/${branch}/runs?date=${date}`;
    const check = await fetch(`${base}${dayPath}`, { headers: { cookie } });
    const body = await check.text();
    const day = JSON.parse(body) as { id: number; pallets: number }[];
    if (check.status !== 200 || day.length !== RUNS) throw new Error(`day plan answered ${check.status} with ${day.length} runs`);
    console.log(`  day plan: ${day.length} runs, ${day.reduce((s, r) => s + r.pallets, 0)} pallets, ${(body.length / 1024).toFixed(0)} kB of JSON`);

    await load(bareBase, '/bare', {}); // warm-up of the load generator, not reported
    const dayRun = await load(base, dayPath, { cookie });
    const plain = await load(bareBase, '/bare', {});

    const fullest = day.reduce((a, b) => (b.pallets > a.pallets ? b : a));
    const times: number[] = [];
    let bytes = 0;
    for (let i = 0; i < PDF_REPEATS + 1; i++) {
      const t0 = performance.now();
      const res = await fetch(`${base}/api/runs/${fullest.id}/loading-sheet.pdf`, { headers: { cookie } });
      const buf = Buffer.from(await res.arrayBuffer());
      if (res.status !== 200) throw new Error(`loading sheet answered ${res.status}`);
      bytes = buf.length;
      if (i > 0)
        times.push(performance.now() - t0); // the first one loads pdfkit and the font
      else console.log(`  first loading sheet (pdfkit and the font loaded): ${(performance.now() - t0).toFixed(0)} ms`);
    }
    times.sort((a, b) => a - b);
    const pdfMs = Math.round(times[Math.floor(times.length / 2)]);
    server.close();
    bareServer.close();
    server.closeAllConnections();
    bareServer.closeAllConnections();

    const errors = dayRun.errors + dayRun.non2xx + plain.errors + plain.non2xx;
    const fmt = (name: string, r: autocannon.Result) =>
      `${name.padEnd(10)} p50 ${String(r.latency.p50).padStart(4)} ms   p99 ${String(r.latency.p99).padStart(4)} ms   ${Math.round(r.requests.average).toLocaleString('en-GB').padStart(6)} req/s   (${r.requests.total.toLocaleString('en-GB')} requests, ${CONNECTIONS} connections, ${SECONDS} s)`;
    console.log(fmt('day plan', dayRun));
    console.log(fmt('bare route', plain));
    const ratio = Math.round((dayRun.latency.p99 / Math.max(plain.latency.p99, 1)) * 100) / 100;
    console.log(
      `ratio p99 day/bare ${ratio} (target ≤ ${TARGET_RATIO}); loading sheet of ${fullest.pallets} pallets: median ${pdfMs} ms over ${PDF_REPEATS}, ${(bytes / 1024).toFixed(0)} kB${errors ? `; ${errors} errors or non-2xx answers` : ''}`,
    );
    console.log(JSON.stringify({ runs: day.length, day_p99_ms: dayRun.latency.p99, bare_p99_ms: plain.latency.p99, ratio_p99: ratio, pdf_ms: pdfMs }));
  } finally {
    await db.destroy();
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
