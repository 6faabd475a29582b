/**
 * Order-book benchmark: 100,000 orders (with their lines) in a temporary SQLite file, or with
 * `--db pg` in a database of a throw-away PostgreSQL cluster started for the run from the machine's
 * own binaries (server/db/pg-cluster.ts); then the merchant's order list endpoint (filtered by stage
 * and branch, sorted, paged, signed in) under concurrent load with autocannon (50 connections) against
 * the whole app in this process on 127.0.0.1, and a bare Express JSON route in the same run for
 * comparison. On PostgreSQL two app instances (two app objects, each with its own connection pool,
 * as two servers behind a balancer) share the database and the connections are dealt out between them
 * in turn. Prints p50/p99 latency and requests per second for both and their ratio, and ends with one
 * JSON line. Targets: list p99 within 2× of the bare route on SQLite, within 3× on PostgreSQL.
 *
 * It also prints the process's CPU time per request in each run (the app and autocannon together, as
 * autocannon runs in this process for both): on a machine shared with other work the p99 of each run
 * depends on how much of a core the process got in its ten seconds; the CPU a request costs does not
 * depend on that, though contention for caches still inflates it (measured: list/bare 3.2 at load
 * average 4, 5.2 at 19), so compare it between runs taken at similar load.
 * On PostgreSQL the database's own CPU is in its server processes and not counted.
 *
 * The list is measured twice. "order list" is the desk's working day: the same few views asked for
 * again and again by everyone at the desk, which the order-book cache answers until an order
 * changes. "cold lookups" asks on every request for a page nobody has asked for lately: the first
 * three pages of each of the 200 contractors' orders, by placing date and by stage (1,200 different
 * pages, more than the cache keeps), so every one of them reaches SQLite: the figure for a cold book.
 *
 *   npm run bench:orders [-- --db pg] [-- --check] [-- --seconds=10] [-- --connections=50]
 */
import { mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import autocannon from 'autocannon';
import express from 'express';
import pino from 'pino';
import { createApp } from '../../server/app';
import { hashPassword } from '../../server/auth/passwords';
import { loadConfig } from '../../server/config/env';
import { createDb, migrateLatest, type Db } from '../../server/db/knex';
import { startPgCluster, type PgCluster } from '../../server/db/pg-cluster';
import { ORDER_STATUSES } from '../../shared/schemas/order.schema';

const ORDERS = 100_000;
const CONTRACTORS = 200;
const LINES_PER_ORDER = 3;
const argValue = (name: string) => {
  const i = process.argv.findIndex((a) => a === `--${name}` || a.startsWith(`--${name}=`));
  if (i < 0) return undefined;
  return process.argv[i].includes('=') ? process.argv[i].split('=')[1] : process.argv[i + 1];
};
const DB: 'sqlite' | 'pg' = argValue('db') === 'pg' ? 'pg' : 'sqlite';
const CONNECTIONS = Number(argValue('connections') ?? 50);
const INSTANCES = DB === 'pg' ? 2 : 1;
const TARGET_RATIO = DB === 'pg' ? 3 : 2;
const SECONDS = Number(argValue('seconds') ?? 10);
const PASSWORD = 'bench-password-123';

/** Small seeded generator (mulberry32), so every run lists the same book. */
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

/** One merchant with two branches, 200 contractors with a site each, and 100,000 orders over two years. */
async function seedBook(db: Db) {
  const now = new Date().toISOString();
  const hash = await hashPassword(PASSWORD);
  const merchant = idOf((await db('organisations').insert({ name: 'Benchmark Roofing Supplies', kind: 'merchant', created_at: now }).returning('id'))[0]);
  const branches: number[] = [];
  for (const name of ['North Yard', 'South Depot']) {
    branches.push(idOf((await db('branches').insert({ organisation_id: merchant, name, address: '1 Bench Road', town: 'Benchton', created_at: now }).returning('id'))[0]));
  }
  await db('users').insert({ organisation_id: merchant, email: 'desk@bench.test', name: 'Bench Desk', role: 'merchant_sales', password_hash: hash, created_at: now });
  const product = idOf(
    (
      await db('products')
        .insert({ organisation_id: merchant, sku: 'BEN-TILE', name: 'Bench tile', category: 'tile', unit: 'tile', pack_size: 1, pack_weight_kg: 4.4, technical: '{}', created_at: now, updated_at: now })
        .returning('id')
    )[0],
  );
  const contractors: { org: number; project: number }[] = [];
  await db.transaction(async (trx) => {
    for (let i = 0; i < CONTRACTORS; i++) {
      const org = idOf(
        (
          await trx('organisations')
            .insert({ name: `Contractor ${String(i).padStart(3, '0')} Roofing`, kind: 'contractor', created_at: now })
            .returning('id')
        )[0],
      );
      const project = idOf(
        (
          await trx('projects')
            .insert({ organisation_id: org, name: `Site ${i}`, site_address: `${i} Bench Lane`, created_at: now, updated_at: now })
            .returning('id')
        )[0],
      );
      contractors.push({ org, project });
    }
  });
  const rand = rng(7);
  const site = JSON.stringify({
    name: 'Site',
    site_address: '1 Bench Lane',
    site_postcode: '',
    contact_name: '',
    contact_phone: '',
    vehicle_access: 'any',
    crane_lift: 'allowed',
    overhead_lines: 'none',
    set_down_place: '',
    access_notes: '',
  });
  const start = Date.parse('2025-01-01T00:00:00Z');
  const BATCH = 500;
  for (let done = 0; done < ORDERS; done += BATCH * 20) {
    await db.transaction(async (trx) => {
      // PostgreSQL runs the order-book counter's trigger once per row, which makes seeding 400,000 rows
      // take minutes; the seed switches triggers off for its own transactions (the book starts uncached).
      if (DB === 'pg') await trx.raw('SET LOCAL session_replication_role = replica');
      for (let b = done; b < Math.min(ORDERS, done + BATCH * 20); b += BATCH) {
        const rows = [];
        for (let i = b; i < Math.min(ORDERS, b + BATCH); i++) {
          const c = contractors[Math.floor(rand() * contractors.length)];
          const placed = new Date(start + Math.floor(rand() * 700 * 86_400_000));
          const placedAt = placed.toISOString();
          rows.push({
            contractor_organisation_id: c.org,
            merchant_organisation_id: merchant,
            branch_id: branches[Math.floor(rand() * branches.length)],
            project_id: c.project,
            status: ORDER_STATUSES[Math.floor(rand() * ORDER_STATUSES.length)],
            revision: 1,
            requested_date: new Date(placed.getTime() + Math.floor(rand() * 30) * 86_400_000).toISOString().slice(0, 10),
            delivery_method: rand() < 0.5 ? 'ground' : 'roof',
            po_reference: `PO-${i}`,
            notes: '',
            site_name: `Site ${i % 997}`,
            site,
            subtotal: Math.floor(rand() * 2_000_000),
            placed_at: placedAt,
            updated_at: placedAt,
          });
        }
        const ids = (await trx('orders').insert(rows).returning('id')).map(idOf);
        const lines = ids.flatMap((orderId) =>
          Array.from({ length: LINES_PER_ORDER }, (_, p) => ({
            order_id: orderId,
            position: p + 1,
            product_id: product,
            sku: 'BEN-TILE',
            description: 'Bench tile',
            category: 'tile',
            unit: 'tile',
            pack_size: 1,
            pack_weight_kg: 4.4,
            quantity: 100,
            back_order_quantity: 0,
            reserved_quantity: 0,
            unit_price: 100,
            total: 10_000,
            status: 'asked',
          })),
        );
        for (let i = 0; i < lines.length; i += 500) await trx('order_lines').insert(lines.slice(i, i + 500));
      }
    });
  }
  // On PostgreSQL, VACUUM as well: otherwise the autovacuum of 400,000 fresh rows runs during the measured
  // seconds, a cost of the bulk load that a desk's long-lived book does not carry.
  await db.raw(DB === 'pg' ? 'vacuum analyze' : 'analyze');
  return { branches, contractors: contractors.map((c) => c.org) };
}

function listen(app: express.Express): Promise<Server> {
  return new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
}

/** Signs the desk in over HTTP like a browser does and returns the session cookie. */
async function signIn(base: string): Promise<string> {
  const first = await fetch(`${base}/api/auth/csrf`);
  const cookie = (first.headers.get('set-cookie') ?? '').split(';')[0];
  const { token } = (await first.json()) as { token: string };
  const res = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': token, cookie },
    body: JSON.stringify({ email: 'desk@bench.test', password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`);
  return (res.headers.get('set-cookie') ?? cookie).split(';')[0];
}

/** A load run's result with the process's CPU time per request (server and load generator together). */
type Run = autocannon.Result & { cpuUsPerRequest: number };

async function run(url: string | string[], paths: string[], headers: Record<string, string>): Promise<Run> {
  const before = process.cpuUsage();
  const result = await load(url, paths, headers);
  const cpu = process.cpuUsage(before);
  return Object.assign(result, { cpuUsPerRequest: Math.round((cpu.user + cpu.system) / Math.max(result.requests.total, 1)) });
}

function load(url: string | string[], paths: string[], headers: Record<string, string>): Promise<autocannon.Result> {
  let i = 0;
  return new Promise((resolve, reject) => {
    autocannon(
      {
        // Several addresses are dealt out over the connections in turn (connection i to url i mod n);
        // the published types name only one.
        url: url as string,
        connections: CONNECTIONS,
        duration: SECONDS,
        headers,
        requests: [{ setupRequest: (req) => ({ ...req, path: paths[i++ % paths.length] }) }],
      },
      (err, result) => (err ? reject(err) : resolve(result)),
    );
  });
}

/** Where the book lives: a SQLite file, or a new database in a throw-away PostgreSQL cluster. */
async function openDatabase(dir: string): Promise<{ env: Record<string, string>; cluster?: PgCluster }> {
  if (DB === 'sqlite') return { env: {} };
  const cluster = await startPgCluster();
  const admin = createDb(cluster.adminUrl);
  try {
    // The first connection to a new cluster can take longer than the pool's 10 s on a loaded machine
    // (a new server process, its caches cold): it is tried again for up to two minutes.
    for (let attempt = 1; ; attempt++) {
      try {
        await admin.raw('CREATE DATABASE ridgeload_bench');
        break;
      } catch (err) {
        if (attempt >= 12 || !/timeout acquiring a connection/i.test(String(err))) throw err;
        console.log(`no connection to the new cluster yet (attempt ${attempt}); trying again`);
      }
    }
  } catch (err) {
    cluster.stop(); // nothing else would stop it: the run ends here
    throw err;
  } finally {
    await admin.destroy();
  }
  console.log(`throw-away PostgreSQL cluster on port ${cluster.port} (data in ${dir})`);
  return { env: { DATABASE_URL: cluster.adminUrl.replace(/\/postgres$/, '/ridgeload_bench'), SESSION_SECRET: 'bench-session-secret-of-at-least-32-chars' }, cluster };
}

async function main() {
  const dir = mkdtempSync(join(tmpdir(), 'ridgeload-bench-'));
  const { env, cluster } = await openDatabase(dir);
  // An interrupted run still stops its PostgreSQL cluster.
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.once(signal, () => {
      cluster?.stop();
      process.exit(130);
    });
  }
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dir, LOGIN_RATE_LIMIT: '1000', ...env });
  const db = createDb(config.database);
  // Each further instance is another server on the same database: its own connections, its own memory.
  const others = Array.from({ length: INSTANCES - 1 }, () => createDb(config.database));
  try {
    await migrateLatest(db);
    const t0 = performance.now();
    const { branches, contractors } = await seedBook(db);
    const count = Number((await db('orders').count({ n: '*' }).first())?.n);
    console.log(
      `seeded ${count.toLocaleString('en-GB')} orders (${(count * LINES_PER_ORDER).toLocaleString('en-GB')} lines) in ${DB === 'pg' ? 'PostgreSQL' : 'SQLite'} in ${((performance.now() - t0) / 1000).toFixed(1)} s`,
    );

    const mailer = { send: async () => {}, close: () => {} };
    const servers: Server[] = [];
    for (const instanceDb of [db, ...others]) {
      servers.push(await listen(createApp({ config, db: instanceDb, mailer, logger: pino({ level: 'silent' }) })));
    }
    const bases = servers.map((s) => `http://127.0.0.1:${(s.address() as AddressInfo).port}`);
    const base = bases[0];
    // One desk session, signed in on the first server, carried to every other one as a browser behind a balancer would.
    const cookie = await signIn(base);

    const bare = express();
    bare.get('/bare', (_req, res) => {
      res.json({ orders: [], total: 0, page: 1, page_size: 25 });
    });
    const bareServer = await listen(bare);
    const bareBase = `http://127.0.0.1:${(bareServer.address() as AddressInfo).port}`;

    // What a desk does all day: open stages at one branch, by delivery day; newest first; a contractor's; a date range.
    const paths = [
      `/api/orders?statuses=sent,agreed&branch_id=${branches[0]}&sort=requested_date&dir=asc&page=1&page_size=25`,
      `/api/orders?status=confirmed&sort=placed_at&dir=desc&page=2&page_size=25`,
      `/api/orders?branch_id=${branches[1]}&sort=placed_at&dir=desc&page=1&page_size=50`,
      `/api/orders?statuses=sent,changes_offered,agreed&date_from=2026-03-01&date_to=2026-03-31&sort=requested_date&dir=asc&page=1&page_size=25`,
      `/api/orders?sort=updated_at&dir=desc&page=3&page_size=25`,
    ];
    for (const [i, p] of paths.entries()) {
      const res = await fetch(`${bases[i % bases.length]}${p}`, { headers: { cookie } });
      const body = (await res.json()) as { orders: unknown[]; total: number };
      if (res.status !== 200 || body.orders.length === 0) throw new Error(`${p} answered ${res.status} with ${body.orders?.length} orders`);
      console.log(`  ${p.slice(12)} → ${body.total.toLocaleString('en-GB')} matching, ${body.orders.length} on the page`);
    }

    // 1,200 different pages, each new to the cache when its turn comes round (it keeps 500).
    const turning = [1, 2, 3].flatMap((page) =>
      ['sort=placed_at&dir=desc', 'status=confirmed&sort=requested_date&dir=asc'].flatMap((view) => contractors.map((c) => `/api/orders?contractor_id=${c}&${view}&page=${page}&page_size=25`)),
    );

    await run(bareBase, ['/bare'], {}); // warm-up of the load generator itself, not reported
    // autocannon deals the connections out over the instances in turn.
    const list = await run(bases, paths, { cookie });
    const cold = await run(bases, turning, { cookie });
    const plain = await run(bareBase, ['/bare'], {});
    for (const s of [...servers, bareServer]) {
      s.close();
      s.closeAllConnections();
    }

    const errors = list.errors + list.non2xx + cold.errors + cold.non2xx + plain.errors + plain.non2xx;
    const fmt = (name: string, r: Run) =>
      `${name.padEnd(13)} p50 ${String(r.latency.p50).padStart(4)} ms   p99 ${String(r.latency.p99).padStart(4)} ms   ${Math.round(r.requests.average).toLocaleString('en-GB').padStart(6)} req/s   ${String(r.cpuUsPerRequest).padStart(5)} µs CPU/request   (${r.requests.total.toLocaleString('en-GB')} requests, ${CONNECTIONS} connections, ${SECONDS} s)`;
    console.log(fmt('order list', list));
    console.log(fmt('cold lookups', cold));
    console.log(fmt('bare route', plain));
    const ratioOf = (r: autocannon.Result) => Math.round((r.latency.p99 / Math.max(plain.latency.p99, 1)) * 100) / 100;
    const ratio = ratioOf(list);
    console.log(
      `${DB === 'pg' ? 'PostgreSQL' : 'SQLite'}, ${INSTANCES} app instance${INSTANCES > 1 ? 's' : ''}; load average ${loadavg()
        .map((l) => l.toFixed(2))
        .join(' ')}`,
    );
    const cpuRatio = Math.round((list.cpuUsPerRequest / Math.max(plain.cpuUsPerRequest, 1)) * 100) / 100;
    console.log(`ratio p99 list/bare ${ratio} (target ≤ ${TARGET_RATIO}); cold lookups/bare ${ratioOf(cold)}; CPU per request list/bare ${cpuRatio}${errors ? `; ${errors} errors or non-2xx answers` : ''}`);
    console.log(
      JSON.stringify({
        db: DB,
        instances: INSTANCES,
        connections: CONNECTIONS,
        orders: count,
        list_p99_ms: list.latency.p99,
        bare_p99_ms: plain.latency.p99,
        ratio_p99: ratio,
        list_rps: Math.round(list.requests.average),
        bare_rps: Math.round(plain.requests.average),
        cold_p99_ms: cold.latency.p99,
        cold_ratio_p99: ratioOf(cold),
        cold_rps: Math.round(cold.requests.average),
        list_cpu_us: list.cpuUsPerRequest,
        bare_cpu_us: plain.cpuUsPerRequest,
        cpu_ratio: cpuRatio,
        errors,
        // of which: no answer within autocannon's 10 s (a loaded machine), and answers other than 2xx
        timeouts: list.timeouts + cold.timeouts + plain.timeouts,
        non_2xx: list.non2xx + cold.non2xx + plain.non2xx,
        load_avg_1m: Math.round(loadavg()[0] * 100) / 100,
      }),
    );
    if (process.argv.includes('--check') && (ratio > TARGET_RATIO || errors > 0)) process.exitCode = 1;
  } finally {
    await Promise.all([db, ...others].map((d) => d.destroy()));
    cluster?.stop();
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
