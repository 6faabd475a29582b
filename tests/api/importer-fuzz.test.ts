import { tableFingerprint } from '../setup/db-fingerprint';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_CATALOGUES } from '../../seeds/02-catalogue';
import { createTestApp, type TestApp } from '../setup/test-app';
import { signIn } from '../setup/scenario';
import { contractorWithEstimate, merchantWithCatalogue } from '../setup/order-scenario';
import type { Client } from '../setup/test-app';

/**
 * Random files thrown at the two importers: whatever arrives, the answer is a stored version or a
 * refusal naming its problems (never a server error), and a refusal leaves nothing behind.
 */

let t: TestApp;
let m: Awaited<ReturnType<typeof merchantWithCatalogue>>;
let k: Awaited<ReturnType<typeof contractorWithEstimate>>;
let desk: Client;
let skus: string[];
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
  m = await merchantWithCatalogue(t, DEMO_CATALOGUES[0]);
  k = await contractorWithEstimate(t, m);
  desk = await signIn(t.app, m.salesEmail);
  skus = await t.db('products').where({ organisation_id: m.organisationId }).pluck('sku');
}, 60_000);
afterAll(async () => t.close());

async function tableHash(table: string, where: Record<string, unknown>) {
  return tableFingerprint(t.db, table, where);
}

async function upload(c: Client, path: string, body: string) {
  const token = await c.csrf();
  return c.agent.post(path).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(body);
}

const csvCell = (s: string) => (/[",\n\r;]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
const nasty = fc.oneof(
  fc.string({ maxLength: 12 }),
  fc.constantFrom('', '-', 'NaN', 'Infinity', '-0', '1e308', '0x10', '=SUM(A1)', '@x', '+1', '١٢٣', '🏠', '\u0000', '"', '\r', ';', '1,5', '  40  '),
  fc.integer({ min: -100_000, max: 100_000 }).map(String),
  fc.double({ noNaN: false }).map(String),
);

const SCHEDULE_HEADER = 'building,face,quantity,pitch_deg,rafter_mm,eaves_mm,left,right,top';
const scheduleRow = fc.tuple(
  fc.oneof(fc.constantFrom('House', 'Plot 1', 'Garage'), nasty),
  fc.oneof(fc.constantFrom('Front', 'Back', 'Side'), nasty),
  fc.oneof(fc.constantFrom('1', '2'), nasty),
  fc.oneof(fc.integer({ min: 12, max: 75 }).map(String), nasty),
  fc.oneof(fc.integer({ min: 1500, max: 9000 }).map(String), nasty),
  fc.oneof(fc.integer({ min: 1000, max: 20000 }).map(String), nasty),
  fc.oneof(fc.constantFrom('verge', 'hip', 'wall', 'valley'), nasty),
  fc.oneof(fc.constantFrom('verge', 'hip', 'wall', 'valley'), nasty),
  fc.oneof(fc.constantFrom('ridge', 'wall', 'hip'), nasty),
);
const scheduleFile = fc
  .tuple(
    fc.oneof(
      fc.constant(SCHEDULE_HEADER),
      fc.constant(SCHEDULE_HEADER.replace('pitch_deg', 'pitch')),
      fc.array(nasty, { minLength: 1, maxLength: 9 }).map((h) => h.map(csvCell).join(',')),
    ),
    fc.array(scheduleRow, { maxLength: 8 }),
    fc.constantFrom('\n', '\r\n'),
  )
  .map(([header, rows, nl]) => [header, ...rows.map((r) => r.map(csvCell).join(','))].join(nl) + nl);

describe('fuzzing the roof schedule importer', () => {
  it('stores a whole version or refuses with problems and stores nothing; never a server error', async () => {
    const where = { project_id: k.projectId };
    await fc.assert(
      fc.asyncProperty(scheduleFile, async (csv) => {
        const versions = await t.db('schedules').where(where).count({ n: '*' }).first();
        const before = await tableHash('schedules', where);
        const res = await upload(k.c, `/api/projects/${k.projectId}/schedule`, csv);
        expect([201, 413, 422], `${res.status} ${JSON.stringify(res.body).slice(0, 200)}`).toContain(res.status);
        if (res.status === 201) {
          const after = await t.db('schedules').where(where).count({ n: '*' }).first();
          expect(Number(after?.n)).toBe(Number(versions?.n) + 1);
          expect(res.body.face_count).toBeGreaterThan(0);
        } else {
          expect(res.body.error.code).toMatch(/invalid_schedule|payload_too_large/);
          expect(res.body.error.details?.length ?? 1).toBeGreaterThan(0);
          expect(await tableHash('schedules', where)).toBe(before);
        }
      }),
      { numRuns: 60, seed: 20261205 },
    );
  }, 120_000);
});

const priceRow = fc.tuple(
  fc.oneof(fc.constantFrom(...['TRS-FL420-SG', 'TRS-BAT-3825', 'NOPE-1']), nasty),
  fc.oneof(
    fc.integer({ min: 0, max: 99_999 }).map((p) => (p / 100).toFixed(2)),
    nasty,
  ),
  fc.oneof(fc.constantFrom('0', '5', '20'), nasty),
);
const priceFile = fc.tuple(fc.constantFrom('sku,price,tax_rate', 'sku;price;tax_rate', 'sku,price', 'price,sku,tax_rate'), fc.array(priceRow, { maxLength: 8 })).map(([header, rows]) => {
  const sep = header.includes(';') ? ';' : ',';
  const width = header.split(sep).length;
  return [header, ...rows.map((r) => r.slice(0, width).map(csvCell).join(sep))].join('\n') + '\n';
});

describe('fuzzing the price-list importer', () => {
  it('applies a whole file or refuses it naming rows and changes no price; never a server error', async () => {
    const where = { branch_id: m.branchId };
    await fc.assert(
      fc.asyncProperty(priceFile, async (csv) => {
        const before = await tableHash('branch_products', where);
        const products = await tableHash('products', { organisation_id: m.organisationId });
        const res = await upload(desk, `/api/branches/${m.branchId}/price-list`, csv);
        expect([200, 422], `${res.status} ${JSON.stringify(res.body).slice(0, 200)}`).toContain(res.status);
        if (res.status === 422) {
          expect(res.body.error.code).toBe('invalid_sheet');
          expect(res.body.error.details.length).toBeGreaterThan(0);
          for (const d of res.body.error.details) expect(typeof d.row).toBe('number');
          expect(await tableHash('branch_products', where)).toBe(before);
          expect(await tableHash('products', { organisation_id: m.organisationId })).toBe(products);
        } else {
          expect(res.body.rows).toBe(res.body.added + res.body.updated + res.body.unchanged);
        }
      }),
      { numRuns: 60, seed: 20261205 },
    );
    expect(skus.length).toBeGreaterThan(5);
  }, 120_000);
});
