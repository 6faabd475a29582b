import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_CATALOGUES } from '../../seeds/02-catalogue';
import { createTestApp, type Client, type TestApp } from '../setup/test-app';
import { signIn } from '../setup/scenario';
import { merchantWithCatalogue, orderBody } from '../setup/order-scenario';
import { makeOrgWithUser } from '../setup/factories';

/**
 * Formula text typed anywhere (a site, a building, a face, a product) is stored as typed and leaves
 * through every spreadsheet export as text: no cell of any CSV or workbook starts with = + - @, a tab
 * or a carriage return unless an apostrophe comes first, and no workbook cell is a formula.
 */

const HYPERLINK = '=HYPERLINK("http://evil.test","open me")';
let t: TestApp;
let desk: Client;
let estimator: Client;
let ids: { branchId: number; estimateId: number; invoiceId: number };

beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
  const m = await merchantWithCatalogue(t, DEMO_CATALOGUES[0]);
  desk = await signIn(t.app, m.salesEmail);
  const tile = m.product('TRS-FL420-SG');
  const renamed = await desk.patch(`/api/products/${tile}`, { name: HYPERLINK });
  expect(renamed.status, JSON.stringify(renamed.body)).toBe(200);
  expect(renamed.body.name).toBe(HYPERLINK);

  const k = await makeOrgWithUser(t.db, 'contractor', 'contractor_estimator', '@Contractor +name');
  estimator = await signIn(t.app, k.email);
  const p = await estimator.post('/api/projects', { name: '-2+3 Formula Row', site_address: '=1+1 Dunsworth', crane_lift: 'allowed', overhead_lines: 'none' });
  expect(p.status).toBe(201);
  expect(p.body.name).toBe('-2+3 Formula Row');
  const csv = [
    'building,face,quantity,pitch_deg,rafter_mm,eaves_mm,left,right,top',
    `"${HYPERLINK.replace(/"/g, '""')}",+Front,1,40,5000,8000,verge,verge,ridge`,
    `"${HYPERLINK.replace(/"/g, '""')}",@Back,1,40,5000,8000,verge,verge,ridge`,
    '',
  ].join('\n');
  const token = await estimator.csrf();
  const s = await estimator.agent.post(`/api/projects/${p.body.id}/schedule`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(csv);
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  const e = await estimator.post(`/api/projects/${p.body.id}/estimates`, { system_id: m.systemId });
  expect(e.status, JSON.stringify(e.body)).toBe(201);
  const o = await estimator.post('/api/orders', orderBody({ estimate: e.body }, m, { po_reference: '=PO()' }));
  expect(o.status, JSON.stringify(o.body)).toBe(201);
  expect((await desk.post(`/api/orders/${o.body.id}/confirm`, {})).status).toBe(200);
  const inv = await desk.post(`/api/orders/${o.body.id}/invoice`);
  expect(inv.status, JSON.stringify(inv.body)).toBe(201);
  ids = { branchId: m.branchId, estimateId: e.body.id, invoiceId: inv.body.id };
}, 60_000);
afterAll(async () => t.close());

const FORMULA_START = /^(?:[\t\r]|\s*[=+\-@\uFF1D\uFF0B\uFF0D\uFF20])/;
const PLAIN_NUMBER = /^-?\d+(?:\.\d+)?$/;

const binary = (req: ReturnType<Client['get']>) =>
  req.buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });

/** Every text of a CSV export, checked; returns the texts so a test can find its planted value. */
function csvTexts(text: string): string[] {
  const rows = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data;
  const cells = rows.flat();
  const live = cells.filter((c) => FORMULA_START.test(c) && !PLAIN_NUMBER.test(c));
  expect(live, 'cells a spreadsheet would run').toEqual([]);
  return cells;
}

async function xlsxTexts(buf: Buffer): Promise<string[]> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(buf as unknown as ArrayBuffer);
  const texts: string[] = [];
  const live: string[] = [];
  for (const ws of wb.worksheets) {
    ws.eachRow((row) =>
      row.eachCell((cell) => {
        if (cell.type === ExcelJS.ValueType.Formula) live.push(`${ws.name}!${cell.address}: formula`);
        if (typeof cell.value === 'string') {
          texts.push(cell.value);
          if (FORMULA_START.test(cell.value)) live.push(`${ws.name}!${cell.address}: ${cell.value}`);
        }
      }),
    );
  }
  expect(live, 'cells a spreadsheet would run').toEqual([]);
  return texts;
}

describe('every spreadsheet export neutralises formula text', () => {
  it('the estimate’s bill of materials as CSV', async () => {
    const res = await estimator.get(`/api/estimates/${ids.estimateId}/export.csv?table=bill`);
    expect(res.status).toBe(200);
    expect(csvTexts(res.text)).toContain(`'${HYPERLINK}`);
  });

  it('the estimate’s faces as CSV', async () => {
    const res = await estimator.get(`/api/estimates/${ids.estimateId}/export.csv?table=faces`);
    expect(res.status).toBe(200);
    const texts = csvTexts(res.text);
    expect(texts).toContain(`'${HYPERLINK}`);
    expect(texts).toContain("'+Front");
    expect(texts).toContain("'@Back");
  });

  it('the estimate as a workbook (bill, faces and about sheets)', async () => {
    const res = await binary(estimator.get(`/api/estimates/${ids.estimateId}/export.xlsx`));
    expect(res.status).toBe(200);
    const texts = await xlsxTexts(res.body as Buffer);
    expect(texts).toContain(`'${HYPERLINK}`);
    expect(texts).toContain("'-2+3 Formula Row");
    expect(texts).toContain("'=1+1 Dunsworth");
  });

  it('the price list as CSV and as a workbook', async () => {
    const csv = await desk.get(`/api/branches/${ids.branchId}/price-list`);
    expect(csv.status).toBe(200);
    expect(csvTexts(csv.text)).toContain(`'${HYPERLINK}`);
    const xlsx = await binary(desk.get(`/api/branches/${ids.branchId}/price-list?format=xlsx`));
    expect(await xlsxTexts(xlsx.body as Buffer)).toContain(`'${HYPERLINK}`);
  });

  it('the stock counts as CSV and as a workbook', async () => {
    const csv = await desk.get(`/api/branches/${ids.branchId}/stock-counts`);
    expect(csv.status).toBe(200);
    expect(csvTexts(csv.text)).toContain(`'${HYPERLINK}`);
    const xlsx = await binary(desk.get(`/api/branches/${ids.branchId}/stock-counts?format=xlsx`));
    expect(await xlsxTexts(xlsx.body as Buffer)).toContain(`'${HYPERLINK}`);
  });

  it('the invoice as a workbook', async () => {
    const res = await binary(desk.get(`/api/invoices/${ids.invoiceId}/export.xlsx`));
    expect(res.status).toBe(200);
    const texts = await xlsxTexts(res.body as Buffer);
    expect(texts).toContain(`'${HYPERLINK}`);
    expect(texts).toContain("'@Contractor +name");
  });

  it('keeps the typed text as typed in the records themselves', async () => {
    expect((await t.db('products').where({ name: HYPERLINK })).length).toBe(1);
    expect((await t.db('projects').where({ name: '-2+3 Formula Row' })).length).toBe(1);
  });
});
