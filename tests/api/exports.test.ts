import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, kindOfRole } from '../../shared/domain/roles';
import { DEMO_CATALOGUES, installCatalogue } from '../../seeds/02-catalogue';
import { safeCell } from '../../server/modules/exports/spreadsheet-text';
import { Client, createTestApp, type TestApp } from '../setup/test-app';
import { makeOrgWithUser, TEST_PASSWORD } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

async function signedIn(kind: 'contractor' | 'merchant' = 'contractor', role: (typeof ROLES)[number] = 'contractor_estimator') {
  const u = await makeOrgWithUser(t.db, kind, role);
  const c = new Client(t.app);
  expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
  return { ...u, c };
}

/**
 * Names a spreadsheet could run: a formula, a command after +/-, a function after @. They are stored as
 * given (they are only names) and must come out as text.
 */
const FORMULA_BUILDING = '=HYPERLINK("http://evil.test","open me")';
const SCHEDULE = [
  'building,face,quantity,pitch_deg,rafter_mm,eaves_mm,left,right,top',
  `"${FORMULA_BUILDING.replace(/"/g, '""')}",+cmd|' /C calc'!A0,2,40,5000,8000,verge,verge,ridge`,
  `"${FORMULA_BUILDING.replace(/"/g, '""')}",-2+3,2,40,5000,8000,verge,verge,ridge`,
  'Plain,@SUM(1),1,40,5000,8000,verge,verge,ridge',
  'Plain,Back,1,40,5000,8000,verge,verge,ridge',
  '',
].join('\n');

async function estimateWithFormulaNames() {
  const m = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
  const { systemIds } = await installCatalogue(t.db, m.organisationId, [{ id: m.branchId!, priceFactor: 1, stockFactor: 1 }], DEMO_CATALOGUES[0]);
  const owner = await signedIn('contractor', 'contractor_owner');
  const p = await owner.c.post('/api/projects', { name: '=1+1 Terrace', site_address: 'Tansy Lane' });
  const token = await owner.c.csrf();
  const s = await owner.c.agent.post(`/api/projects/${p.body.id}/schedule`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(SCHEDULE);
  expect(s.status).toBe(201);
  const e = await owner.c.post(`/api/projects/${p.body.id}/estimates`, { system_id: systemIds[0].id });
  expect(e.status).toBe(201);
  return { ...owner, estimate: e.body };
}

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

async function download(c: Client, path: string): Promise<{ status: number; type: string; body: Buffer; disposition: string }> {
  const res = await c.agent
    .get(path)
    .buffer(true)
    .parse(binary as never);
  return { status: res.status, type: String(res.headers['content-type']), body: res.body as Buffer, disposition: String(res.headers['content-disposition']) };
}

function textCells(ws: ExcelJS.Worksheet): string[] {
  const out: string[] = [];
  ws.eachRow((row) => row.eachCell((cell) => typeof cell.value === 'string' && out.push(cell.value)));
  return out;
}

describe('the estimate as a spreadsheet', () => {
  it('reads back with the bill of materials and the per-face table as numbers with number formats and a frozen header', async () => {
    const { c, estimate } = await estimateWithFormulaNames();
    const res = await download(c, `/api/estimates/${estimate.id}/export.xlsx`);
    expect(res.status).toBe(200);
    expect(res.type).toMatch(/spreadsheetml\.sheet/);
    expect(res.disposition).toMatch(new RegExp(`estimate-${estimate.id}\\.xlsx`));

    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(res.body as unknown as ArrayBuffer);
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Bill of materials', 'Faces', 'Pallets', 'Lorry loads', 'Roof loading', 'About']);

    const bill = wb.getWorksheet('Bill of materials')!;
    expect(bill.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
    expect(bill.getRow(1).values).toEqual([undefined, 'Category', 'SKU', 'Description', 'Quantity', 'Unit', 'Pack size', 'Packs', 'Pack price', 'Total']);
    estimate.lines.forEach((l: { sku: string; quantity: number; packs: number; unit_price: number; total: number }, i: number) => {
      const row = bill.getRow(i + 2);
      expect(row.getCell(2).value).toBe(l.sku);
      expect(row.getCell(4).value).toBe(l.quantity);
      expect(row.getCell(7).value).toBe(l.packs);
      // Minor units become pounds and pence in the sheet, formatted as money.
      expect(row.getCell(8).value).toBe(l.unit_price / 100);
      expect(row.getCell(9).value).toBe(l.total / 100);
      expect(row.getCell(9).numFmt).toBe('#,##0.00');
      expect(row.getCell(7).numFmt).toBe('#,##0');
    });
    const subtotal = bill.getRow(estimate.lines.length + 2);
    expect(subtotal.getCell(1).value).toBe('Subtotal');
    expect(subtotal.getCell(9).value).toBe(estimate.totals.subtotal / 100);

    const faces = wb.getWorksheet('Faces')!;
    expect(faces.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
    expect(faces.rowCount).toBe(1 + estimate.result.faces.length);
    const first = estimate.result.faces[0];
    expect(faces.getRow(2).getCell(4).value).toBe(first.pitch_deg);
    expect(faces.getRow(2).getCell(6).value).toBe(first.slope_area_m2);
    expect(faces.getRow(2).getCell(6).numFmt).toBe('#,##0.00');
    expect(faces.getRow(2).getCell(8).value).toBe(first.gauge_mm);

    const about = textCells(wb.getWorksheet('About')!).join('\n');
    expect(about).toMatch(/fixing specification/);
    expect(about).toMatch(/Engine version/);
  });

  it('carries the delivery: each pallet with its faces, tiles and weight, the lorry loads and each face’s roof-loading stacks', async () => {
    const { c, estimate } = await estimateWithFormulaNames();
    const res = await download(c, `/api/estimates/${estimate.id}/export.xlsx`);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(res.body as unknown as ArrayBuffer);
    type Pallet = { n: number; kind: string; tiles: number; weight_kg: number; faces: { building: string; face: string; tiles: number }[]; items: { item: string; quantity: number }[] };
    const pallets = estimate.result.pallets as Pallet[];
    expect(pallets.length).toBeGreaterThan(1);

    const sheet = wb.getWorksheet('Pallets')!;
    expect(sheet.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
    expect(sheet.getRow(1).values).toEqual([undefined, 'Pallet', 'Kind', 'Building', 'Face', 'Item', 'Tiles', 'Quantity', 'Pallet tiles', 'Pallet weight (kg)']);
    const rows: { n: number; kind: string; face: string | null; tiles: number | null; quantity: number | null; weight: number }[] = [];
    sheet.eachRow((row, i) => {
      if (i === 1) return;
      const v = (col: number) => row.getCell(col).value;
      rows.push({ n: v(1) as number, kind: v(2) as string, face: (v(4) as string | null) ?? null, tiles: (v(6) as number | null) ?? null, quantity: (v(7) as number | null) ?? null, weight: v(9) as number });
    });
    for (const p of pallets) {
      const mine = rows.filter((r) => r.n === p.n);
      expect(mine.length, `pallet ${p.n}`).toBe(p.faces.length + p.items.length);
      expect(mine.every((r) => r.weight === p.weight_kg)).toBe(true);
      expect(mine.reduce((s, r) => s + (r.tiles ?? 0), 0)).toBe(p.tiles);
      expect(mine[0].kind).toBe(p.kind === 'tiles' ? 'Tiles' : 'Accessories');
    }
    // Every tile ordered is on a pallet, face by face (the spare allowance on its own row).
    expect(rows.reduce((s, r) => s + (r.tiles ?? 0), 0)).toBe(estimate.result.totals.tiles_order);
    expect(rows.some((r) => r.face === 'Back')).toBe(true);

    const loads = wb.getWorksheet('Lorry loads')!;
    expect(loads.rowCount).toBe(1 + estimate.result.loads.length);
    const listed: number[] = [];
    let weight = 0;
    loads.eachRow((row, i) => {
      if (i === 1) return;
      listed.push(...String(row.getCell(2).value).split(', ').map(Number));
      expect(row.getCell(3).value).toBe(String(row.getCell(2).value).split(', ').length);
      weight += row.getCell(4).value as number;
    });
    // Each pallet goes on exactly one load, and the loads weigh what the delivery weighs.
    expect(listed.sort((a, b) => a - b)).toEqual(pallets.map((p) => p.n).sort((a, b) => a - b));
    // Each load's weight is rounded to 0.1 kg, so their sum may differ from the total by a rounding step per load.
    expect(Math.abs(weight - estimate.result.totals.weight_kg)).toBeLessThanOrEqual(0.1 * estimate.result.loads.length);

    const stacks = wb.getWorksheet('Roof loading')!;
    expect(stacks.getRow(1).values).toEqual([undefined, 'Building', 'Face', 'Copies', 'Batten from the eaves', 'Stacks', 'Tiles (full stacks)', 'Face stacks', 'Face load (kg)']);
    const faces = estimate.result.faces as { face: string; courses: number; stacks: number; stacks_by_row: number[] }[];
    const every = estimate.system_input.roof_loading.every_nth_batten as number;
    let r = 2;
    for (const f of faces) {
      f.stacks_by_row.forEach((n, i) => {
        const row = stacks.getRow(r++);
        expect(row.getCell(2).value).toBe(safeCell(f.face));
        expect(row.getCell(4).value).toBe(f.courses - i * every);
        expect(row.getCell(5).value).toBe(n);
      });
      // The rows of a face hold all its stacks.
      expect(f.stacks_by_row.reduce((s, n) => s + n, 0)).toBe(f.stacks);
    }
    expect(textCells(stacks).join('\n')).toMatch(/fixing specification/);
  });

  it('never lets a cell run as a formula: names starting with = + - @ come out as text with an apostrophe', async () => {
    const { c, estimate } = await estimateWithFormulaNames();
    const res = await download(c, `/api/estimates/${estimate.id}/export.xlsx`);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(res.body as unknown as ArrayBuffer);
    for (const ws of wb.worksheets) {
      ws.eachRow((row) =>
        row.eachCell((cell) => {
          expect(cell.type, `${ws.name}!${cell.address}`).not.toBe(ExcelJS.ValueType.Formula);
          if (typeof cell.value === 'string') expect(cell.value, `${ws.name}!${cell.address}`).not.toMatch(/^\s*[=+\-@\t\r]/);
        }),
      );
    }
    const faceCells = textCells(wb.getWorksheet('Faces')!);
    expect(faceCells).toContain(`'${FORMULA_BUILDING}`);
    expect(faceCells).toContain("'+cmd|' /C calc'!A0");
    expect(faceCells).toContain("'-2+3");
    expect(faceCells).toContain("'@SUM(1)");
    expect(textCells(wb.getWorksheet('About')!)).toContain("'=1+1 Terrace");
  });
});

describe('the estimate as CSV', () => {
  it('gives the bill of materials and the faces table as UTF-8 CSV with neutralised text and plain numbers', async () => {
    const { c, estimate } = await estimateWithFormulaNames();
    const bill = await c.get(`/api/estimates/${estimate.id}/export.csv`);
    expect(bill.status).toBe(200);
    expect(bill.headers['content-type']).toMatch(/^text\/csv; charset=utf-8/);
    expect(bill.text.charCodeAt(0)).toBe(0xfeff);
    const rows = Papa.parse<string[]>(bill.text.slice(1), { skipEmptyLines: true }).data;
    expect(rows[0]).toEqual(['Category', 'SKU', 'Description', 'Quantity', 'Unit', 'Pack size', 'Packs', 'Pack price', 'Total']);
    expect(rows.length).toBe(1 + estimate.lines.length);
    expect(Number(rows[1][3])).toBe(estimate.lines[0].quantity);
    expect(Number(rows[1][8])).toBe(estimate.lines[0].total / 100);

    const faces = await c.get(`/api/estimates/${estimate.id}/export.csv?table=faces`);
    const faceRows = Papa.parse<string[]>(faces.text.slice(1), { skipEmptyLines: true }).data;
    expect(faceRows.length).toBe(1 + estimate.result.faces.length);
    const names = faceRows.slice(1).flatMap((r) => [r[0], r[1]]);
    expect(names).toContain(`'${FORMULA_BUILDING}`);
    expect(names).toContain("'-2+3");
    for (const cell of faceRows.slice(1).flat()) expect(cell).not.toMatch(/^\s*[=+\-@\t\r]/);
    expect((await c.get(`/api/estimates/${estimate.id}/export.csv?table=prices`)).status).toBe(422);
  });
});

describe('no role exports another contractor’s estimate', () => {
  it('refuses every role of every other firm, as xlsx and as CSV', async () => {
    const { estimate } = await estimateWithFormulaNames();
    for (const role of ROLES) {
      const actor = await signedIn(kindOfRole(role), role);
      for (const path of [`/api/estimates/${estimate.id}/export.xlsx`, `/api/estimates/${estimate.id}/export.csv`]) {
        const res = await actor.c.get(path);
        expect([403, 404], `${role} ${path}: ${res.status}`).toContain(res.status);
      }
    }
  });
});
