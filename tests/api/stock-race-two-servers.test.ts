import { spawn, type ChildProcess } from 'node:child_process';
import { dirname, join } from 'node:path';
import { createInterface } from 'node:readline';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEST_PASSWORD } from '../setup/factories';
import { contractorWithEstimate, merchantWithCatalogue, orderBody } from '../setup/order-scenario';
import { createTestApp, type TestApp } from '../setup/test-app';

// Two server processes on one database (SQLite file or PostgreSQL), each with its own connections
// and nothing in memory in common, and 200 desks' confirmations alternated between them, all
// competing for the same few pallets: the database alone decides who gets the stock.
const ORDERS = 200;
const TILES_PER_ORDER = 12;
const BATTENS_PER_ORDER = 3;
const COVERED = 37; // orders the tile stock covers; the spare tiles are fewer than one more order needs

let t: TestApp;
let servers: { url: string; child: ChildProcess }[] = [];
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
  servers = await Promise.all([0, 1].map(() => startServerProcess(t)));
}, 60_000);
afterAll(async () => {
  await Promise.all(servers.map((s) => stopServerProcess(s.child)));
  await t?.close();
});

async function startServerProcess(of: TestApp): Promise<{ url: string; child: ChildProcess }> {
  const env = {
    ...process.env,
    SESSION_SECRET: of.config.sessionSecret,
    ...(of.config.databaseUrl ? { DATABASE_URL: of.config.databaseUrl } : { DATA_DIR: dirname(of.config.databaseFile) }),
  };
  const child = spawn(process.execPath, ['--import', 'tsx', join(import.meta.dirname, '../setup/server-process.ts')], { env, stdio: ['pipe', 'pipe', 'inherit'] });
  const first = await new Promise<string>((resolve, reject) => {
    child.once('exit', (code) => reject(new Error(`server process ended with ${code} before listening`)));
    createInterface({ input: child.stdout! }).once('line', resolve);
  });
  return { url: (JSON.parse(first) as { url: string }).url, child };
}

function stopServerProcess(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    child.once('exit', () => resolve());
    child.stdin!.end();
  });
}

/** Signs in over HTTP on one server, as a browser does; the session then works on either server. */
async function signInOver(url: string, email: string): Promise<{ cookie: string; token: string }> {
  const first = await fetch(`${url}/api/auth/csrf`);
  const anon = (first.headers.get('set-cookie') ?? '').split(';')[0];
  const login = await fetch(`${url}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': ((await first.json()) as { token: string }).token, cookie: anon },
    body: JSON.stringify({ email, password: TEST_PASSWORD }),
  });
  expect(login.status, await login.clone().text()).toBe(200);
  const cookie = (login.headers.get('set-cookie') ?? anon).split(';')[0];
  const again = await fetch(`${url}/api/auth/csrf`, { headers: { cookie } });
  return { cookie, token: ((await again.json()) as { token: string }).token };
}

describe('200 confirmations split across two server processes, racing for the last pallets', () => {
  it('confirms exactly the orders the stock covers, refuses the rest with 409, never answers 500 and never oversells', async () => {
    const m = await merchantWithCatalogue(t);
    const k = await contractorWithEstimate(t, m);
    const tileId = m.product('TRS-FL420-SG');
    const battenId = m.product('TRS-BAT-3825');
    // One order placed through the API, copied 199 times in the database (lines and all): the race
    // is in the confirmations, and placing 200 orders one by one would only slow the test.
    const placed = await k.c.post(
      '/api/orders',
      orderBody(k, m, {
        lines: [
          { product_id: tileId, quantity: TILES_PER_ORDER },
          { product_id: battenId, quantity: BATTENS_PER_ORDER },
        ],
      }),
    );
    expect(placed.status, JSON.stringify(placed.body)).toBe(201);
    const ids: number[] = [placed.body.id as number];
    const { id: _order, ...orderRow } = await t.db('orders').where({ id: ids[0] }).first();
    const lineRows = ((await t.db('order_lines').where({ order_id: ids[0] }).orderBy('id')) as { id: number }[]).map(({ id: _line, ...rest }) => rest);
    await t.db.transaction(async (trx) => {
      for (let i = 1; i < ORDERS; i++) {
        const [row] = await trx('orders')
          .insert({ ...orderRow, po_reference: `PO-RACE-${i}` })
          .returning('id');
        const id = typeof row === 'object' ? (row as { id: number }).id : (row as number);
        await trx('order_lines').insert(lineRows.map((l) => ({ ...l, order_id: id })));
        ids.push(id);
      }
    });
    const tileStock = COVERED * TILES_PER_ORDER + TILES_PER_ORDER - 1;
    await t.db('branch_products').where({ branch_id: m.branchId, product_id: tileId }).update({ on_hand: tileStock, reserved: 0 });
    await t
      .db('branch_products')
      .where({ branch_id: m.branchId, product_id: battenId })
      .update({ on_hand: ORDERS * BATTENS_PER_ORDER * 2, reserved: 0 });

    // Two desks, each signed in on one server; every request goes to the other server from the last.
    const desks = [await signInOver(servers[0].url, m.salesEmail), await signInOver(servers[1].url, m.ownerEmail)];
    const answers = await Promise.all(
      ids.map(async (id, i) => {
        const desk = desks[Math.floor(i / 2) % 2];
        // A client waits as long as a 503 asks (Retry-After) and tries again; any other answer is final.
        for (let attempt = 1; ; attempt++) {
          const res = await fetch(`${servers[i % 2].url}/api/orders/${id}/confirm`, {
            method: 'POST',
            headers: { 'content-type': 'application/json', 'x-csrf-token': desk.token, cookie: desk.cookie },
            body: '{}',
          });
          const body = (await res.json()) as { error?: { code: string; details?: { sku: string; requested: number }[] } };
          if (res.status === 503 && attempt < 5) {
            await new Promise((r) => setTimeout(r, Number(res.headers.get('retry-after') ?? 1) * 1000));
            continue;
          }
          return { id, status: res.status, body };
        }
      }),
    );
    const byStatus = Object.fromEntries([...new Set(answers.map((a) => a.status))].map((s) => [s, answers.filter((a) => a.status === s).length]));
    expect(byStatus).toEqual({ 200: COVERED, 409: ORDERS - COVERED });
    for (const a of answers.filter((x) => x.status === 409)) {
      expect(a.body.error).toMatchObject({ code: 'insufficient_stock', details: [expect.objectContaining({ sku: 'TRS-FL420-SG', requested: TILES_PER_ORDER })] });
    }
    // Both servers took part in the winning.
    const winners = answers.filter((a) => a.status === 200).map((a) => a.id);
    expect(new Set(winners.map((id) => ids.indexOf(id) % 2)).size).toBe(2);

    const tile = await t.db('branch_products').where({ branch_id: m.branchId, product_id: tileId }).first();
    const batten = await t.db('branch_products').where({ branch_id: m.branchId, product_id: battenId }).first();
    expect({ on_hand: tile.on_hand, reserved: tile.reserved }).toEqual({ on_hand: tileStock, reserved: COVERED * TILES_PER_ORDER });
    expect(batten.reserved).toBe(COVERED * BATTENS_PER_ORDER);
    const confirmed = ((await t.db('orders').whereIn('id', ids).where({ status: 'confirmed' }).pluck('id')) as number[]).sort((x, y) => x - y);
    expect(confirmed).toEqual(winners.sort((x, y) => x - y));
    const held = (await t.db('order_lines').whereIn('order_id', ids).select('product_id').sum({ r: 'reserved_quantity' }).groupBy('product_id')) as { product_id: number; r: number }[];
    expect(new Map(held.map((h) => [h.product_id, Number(h.r)]))).toEqual(
      new Map([
        [tileId, tile.reserved],
        [battenId, batten.reserved],
      ]),
    );
    expect(
      await t
        .db('order_lines')
        .whereIn(
          'order_id',
          ids.filter((id) => !confirmed.includes(id)),
        )
        .where('reserved_quantity', '>', 0)
        .first(),
    ).toBeUndefined();
  }, 180_000);
});
