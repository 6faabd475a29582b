import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, kindOfRole } from '../../shared/domain/roles';
import { productSchema, merchantRoofSystemListSchema } from '../../shared/schemas/price-list.schema';
import { stockListSchema } from '../../shared/schemas/stock.schema';
import { DEMO_CATALOGUES, installCatalogue } from '../../seeds/02-catalogue';
import { type Client, createTestApp, type TestApp } from '../setup/test-app';
import { signIn } from '../setup/scenario';
import { makeOrgWithUser, makeUser } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const [TOLLERBECK] = DEMO_CATALOGUES;

const login = (email: string) => signIn(t.app, email);

async function merchant() {
  const owner = await makeOrgWithUser(t.db, 'merchant', 'merchant_owner');
  const installed = await installCatalogue(t.db, owner.organisationId, [{ id: owner.branchId!, priceFactor: 1, stockFactor: 1 }], TOLLERBECK);
  const sales = await makeUser(t.db, owner.organisationId, 'merchant_sales');
  const dispatcher = await makeUser(t.db, owner.organisationId, 'merchant_dispatcher');
  return {
    organisationId: owner.organisationId,
    branchId: owner.branchId!,
    desk: await login(sales.email),
    yard: await login(dispatcher.email),
    product: (sku: string) => installed.productIds.get(sku)!,
    systemIds: installed.systemIds,
  };
}
type Merchant = Awaited<ReturnType<typeof merchant>>;

/** Sends a file as the request body. */
async function upload(c: Client, path: string, body: string | Buffer, type = 'text/csv') {
  const token = await c.csrf();
  return c.agent.post(path).set('X-CSRF-Token', token).set('Content-Type', type).send(body);
}

const binary = (req: ReturnType<Client['get']>) =>
  req.buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });

const prices = async (m: Merchant) =>
  new Map((await t.db('branch_products as bp').join('products as p', 'p.id', 'bp.product_id').where('bp.branch_id', m.branchId).select('p.sku', 'bp.pack_price')).map((r) => [r.sku, r.pack_price]));

describe('products', () => {
  const ridge = { sku: 'TRS-RDG-NEW', name: 'Angle ridge, slate grey', category: 'ridge', unit: 'piece', pack_size: 1, pack_weight_kg: 4.6, technical: { cover_mm: 420, weight_kg: 4.6 } };

  it('creates, changes, archives and restores a product with SKU, unit, pack size, weight, category and tax rate', async () => {
    const m = await merchant();
    const res = await m.desk.post('/api/products', ridge);
    expect(res.status).toBe(201);
    const p = productSchema.parse(res.body);
    expect(p).toMatchObject({ ...ridge, tax_rate_bp: 2000, branches: [], archived_at: null });
    expect((await m.desk.patch(`/api/products/${p.id}`, { tax_rate_bp: 500, pack_size: 10 })).body).toMatchObject({ tax_rate_bp: 500, pack_size: 10 });
    expect((await m.desk.send('put', `/api/branches/${m.branchId}/products/${p.id}`, { pack_price: 725 })).body.branches).toEqual([
      expect.objectContaining({ branch_id: m.branchId, pack_price: 725, on_hand: 0, available: 0 }),
    ]);
    expect((await m.desk.delete(`/api/products/${p.id}`)).body.archived_at).not.toBeNull();
    expect((await m.desk.get('/api/products?q=angle')).body.products).toEqual([]);
    expect((await m.desk.get('/api/products?q=angle&archived=all')).body.products).toHaveLength(1);
    expect((await m.desk.post(`/api/products/${p.id}/restore`)).body.archived_at).toBeNull();
  });

  it('refuses a taken SKU, a bad SKU, a negative weight and technical fields that do not fit the category, naming each field', async () => {
    const m = await merchant();
    expect((await m.desk.post('/api/products', { ...ridge, sku: 'TRS-FL420-SG' })).body.error).toMatchObject({ code: 'sku_taken' });
    const bad = await m.desk.post('/api/products', { ...ridge, sku: '=cmd', pack_weight_kg: -1, technical: { cover_mm: 'wide' } });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['pack_weight_kg', 'sku', 'technical.cover_mm', 'technical.weight_kg'].sort());
    expect((await m.desk.patch(`/api/products/${m.product('TRS-RHR-SG')}`, { category: 'batten' })).body.error.details[0].path).toMatch(/^technical\./);
    expect((await m.yard.post('/api/products', ridge)).status).toBe(403);
  });

  it('keeps the pallet footprint the deck plan lays out: 1200 × 1000 mm unless told, changed by PATCH, refused out of range naming the field', async () => {
    // 1200 × 1000 mm is the usual pallet here and 1200 × 800 mm the other common one (common practice).
    const m = await merchant();
    const res = await m.desk.post('/api/products', ridge);
    expect(res.status).toBe(201);
    expect(productSchema.parse(res.body)).toMatchObject({ pallet_length_mm: 1200, pallet_width_mm: 1000 });
    const euro = await m.desk.post('/api/products', { ...ridge, sku: 'TRS-RDG-EUR', pallet_length_mm: 1200, pallet_width_mm: 800 });
    expect(euro.body).toMatchObject({ pallet_length_mm: 1200, pallet_width_mm: 800 });
    const stored = await t.db('products').where('id', euro.body.id).first('pallet_length_mm', 'pallet_width_mm');
    expect(stored).toEqual({ pallet_length_mm: 1200, pallet_width_mm: 800 });
    const changed = await m.desk.patch(`/api/products/${res.body.id}`, { pallet_width_mm: 800 });
    expect(changed.body).toMatchObject({ pallet_length_mm: 1200, pallet_width_mm: 800 });
    expect((await m.desk.get(`/api/products?q=TRS-RDG-NEW`)).body.products[0]).toMatchObject({ pallet_width_mm: 800 });
    const bad = await m.desk.post('/api/products', { ...ridge, sku: 'TRS-RDG-BAD', pallet_length_mm: 1.2, pallet_width_mm: 12_000 });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details).toEqual(
      expect.arrayContaining([
        { path: 'pallet_length_mm', message: 'must be whole mm' },
        { path: 'pallet_width_mm', message: 'must be at most 2,500 mm' },
      ]),
    );
    expect(await t.db('products').where('sku', 'TRS-RDG-BAD').first()).toBeUndefined();
  });

  it('builds a roof system from the merchant’s own products and says when it cannot be offered', async () => {
    const m = await merchant();
    const s = await m.desk.post('/api/roof-systems', {
      branch_id: m.branchId,
      name: 'Flatlock on 50 × 25',
      components: { tile: m.product('TRS-FL420-SG'), ridge: m.product('TRS-RHR-SG'), batten: m.product('TRS-BAT-3825'), batten_nail: m.product('TRS-NB65-1K'), tile_nail: m.product('TRS-NT38-1K') },
    });
    expect(s.status).toBe(201);
    expect(s.body).toMatchObject({ offerable: false, problems: ['has no underlay product'] });
    const fixed = await m.desk.patch(`/api/roof-systems/${s.body.id}`, {
      components: { ...Object.fromEntries(s.body.components.map((c: { role: string; product_id: number }) => [c.role, c.product_id])), underlay: m.product('TRS-UVP-50') },
    });
    expect(fixed.body).toMatchObject({ offerable: true, problems: [] });
    // A change names only what changes: renaming keeps the description and the settings.
    await m.desk.patch(`/api/roof-systems/${s.body.id}`, { description: 'For the Hollin Brow plots', settings: { rafter_spacing_mm: 450 } });
    const renamed = await m.desk.patch(`/api/roof-systems/${s.body.id}`, { name: 'Flatlock on 50 × 25, plots' });
    expect(renamed.body).toMatchObject({ name: 'Flatlock on 50 × 25, plots', description: 'For the Hollin Brow plots', settings: { rafter_spacing_mm: 450 }, offerable: true });
    const wrong = await m.desk.post('/api/roof-systems', { branch_id: m.branchId, name: 'x', components: { tile: m.product('TRS-RHR-SG') } });
    expect(wrong.body.error.details[0]).toMatchObject({ path: 'components.tile', message: expect.stringMatching(/ridge product/) });
    const list = merchantRoofSystemListSchema.parse((await m.desk.get(`/api/roof-systems?branch_id=${m.branchId}`)).body);
    expect(list.systems.map((x) => x.name)).toContain('Flatlock on 50 × 25, plots');
    expect((await m.desk.delete(`/api/roof-systems/${s.body.id}`)).status).toBe(204);
    expect((await m.desk.get(`/api/roof-systems/${s.body.id}`)).status).toBe(404);
  });
});

describe('price lists as files', () => {
  it('exports the branch’s price list as CSV and .xlsx and takes it back unchanged', async () => {
    const m = await merchant();
    const csv = await m.desk.get(`/api/branches/${m.branchId}/price-list?format=csv`);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.text.startsWith('\uFEFFsku,name,category,unit,pack_size,pack_weight_kg,tax_rate,price\r\n')).toBe(true);
    expect(csv.text).toMatch(/TRS-FL420-SG,.*,20,1\.28\r\n/);
    const again = await upload(m.desk, `/api/branches/${m.branchId}/price-list`, csv.text);
    expect(again.status, JSON.stringify(again.body)).toBe(200);
    // One row per product the branch sells: the whole demo catalogue.
    const sold = TOLLERBECK.products.length;
    expect(again.body).toMatchObject({ rows: sold, updated: 0, added: 0, unchanged: sold });
    const xlsx = await binary(m.desk.get(`/api/branches/${m.branchId}/price-list?format=xlsx`));
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(xlsx.body as ArrayBuffer);
    wb.worksheets[0].getRow(2).getCell(8).value = 9.99;
    const edited = Buffer.from(await wb.xlsx.writeBuffer());
    const res = await upload(m.desk, `/api/branches/${m.branchId}/price-list`, edited, 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    expect(res.body).toMatchObject({ updated: 1, unchanged: sold - 1 });
    expect((await prices(m)).get(String(wb.worksheets[0].getRow(2).getCell(1).value))).toBe(999);
  });

  it('neutralises text that a spreadsheet would run as a formula', async () => {
    const m = await merchant();
    await t
      .db('products')
      .where({ id: m.product('TRS-CLP-FL') })
      .update({ name: '=HYPERLINK("http://example.test","clips")' });
    const csv = (await m.desk.get(`/api/branches/${m.branchId}/price-list`)).text;
    expect(csv).toMatch(/"'=HYPERLINK\(/);
    const xlsx = await binary(m.desk.get(`/api/branches/${m.branchId}/price-list?format=xlsx`));
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(xlsx.body as ArrayBuffer);
    const names: unknown[] = [];
    wb.worksheets[0].eachRow((r) => names.push(r.getCell(2).value));
    expect(names).toContain(`'=HYPERLINK("http://example.test","clips")`);
  });

  it('rejects a file with an unknown SKU, text in a number, a negative price, a formula and a duplicate, naming row and column, and changes nothing', async () => {
    const m = await merchant();
    const before = await prices(m);
    const file = [
      'sku,price,tax_rate',
      'TRS-FL420-SG,1.30,20',
      'NOPE-123,2.00,20',
      'TRS-RHR-SG,six pounds,20',
      'TRS-HTR-SG,-4.50,20',
      'TRS-BAT-3825,=1+2,20',
      '=cmd|calc,1.00,20',
      'TRS-FL420-SG,1.31,20',
      'TRS-UVP-50,64.001,20',
      'TRS-VAL-3M,28.90,120',
    ].join('\n');
    const res = await upload(m.desk, `/api/branches/${m.branchId}/price-list`, file);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('invalid_sheet');
    expect(res.body.error.details.map((d: { row: number; column: string }) => [d.row, d.column])).toEqual([
      [3, 'sku'],
      [4, 'price'],
      [5, 'price'],
      [6, 'price'],
      [7, 'sku'],
      [8, 'sku'],
      [9, 'price'],
      [10, 'tax_rate'],
    ]);
    expect(res.body.error.details[0].message).toMatch(/no product with the SKU "NOPE-123"/);
    expect(res.body.error.details[1].message).toMatch(/is not a number/);
    expect(res.body.error.details[2].message).toMatch(/must not be negative/);
    expect(res.body.error.details[3].message).toMatch(/formula/);
    expect(res.body.error.details[5].message).toMatch(/already priced on row 2/);
    expect(await prices(m)).toEqual(before);
  });

  it('names a missing column and refuses a workbook cell that holds a formula', async () => {
    const m = await merchant();
    const missing = await upload(m.desk, `/api/branches/${m.branchId}/price-list`, 'sku,cost\nTRS-FL420-SG,1.30\n');
    expect(missing.status).toBe(422);
    expect(missing.body.error.details).toEqual([{ row: 1, column: 'price', message: 'the column "price" is missing from the header row' }]);
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('Prices');
    ws.addRow(['sku', 'price']);
    ws.addRow(['TRS-FL420-SG', { formula: '1+0.3', result: 1.3 }]);
    const res = await upload(m.desk, `/api/branches/${m.branchId}/price-list`, Buffer.from(await wb.xlsx.writeBuffer()), 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    expect(res.body.error.details).toEqual([{ row: 2, column: 'price', message: 'holds a spreadsheet formula: paste the value itself' }]);
    expect((await upload(m.desk, `/api/branches/${m.branchId}/price-list`, Buffer.from([0xff, 0xfe, 0x00]))).body.error.details[0]).toMatchObject({ row: 1 });
  });

  it('adds a catalogue product to the branch’s list at the price in the file', async () => {
    const m = await merchant();
    const p = await m.desk.post('/api/products', { sku: 'TRS-VNT-01', name: 'Tile vent, slate grey', category: 'accessory', unit: 'piece', pack_size: 1, pack_weight_kg: 1.2 });
    const res = await upload(m.desk, `/api/branches/${m.branchId}/price-list`, `sku,price\nTRS-VNT-01,"1,234.50"\n`);
    expect(res.body).toMatchObject({ added: 1 });
    expect((await m.desk.get(`/api/products/${p.body.id}`)).body.branches[0]).toMatchObject({ pack_price: 123450 });
  });
});

describe('stock per branch', () => {
  it('lists on hand, reserved, available and reorder level, and changes a count but never below what is reserved', async () => {
    const m = await merchant();
    const tiles = m.product('TRS-FL420-SG');
    await t.db('branch_products').where({ branch_id: m.branchId, product_id: tiles }).update({ on_hand: 1000, reserved: 400, reorder_level: 700 });
    const list = stockListSchema.parse((await m.yard.get(`/api/branches/${m.branchId}/stock?low=true`)).body);
    expect(list.items.find((i) => i.sku === 'TRS-FL420-SG')).toMatchObject({ on_hand: 1000, reserved: 400, available: 600, reorder_level: 700, state: 'low' });
    expect((await m.yard.patch(`/api/branches/${m.branchId}/stock/${tiles}`, { on_hand: 399 })).body.error.code).toBe('below_reserved');
    expect((await m.yard.patch(`/api/branches/${m.branchId}/stock/${tiles}`, { on_hand: 2000, reorder_level: 500 })).body).toMatchObject({ on_hand: 2000, available: 1600, state: 'in_stock' });
  });

  it('imports stock counts in one go, refusing a count below reservations and a SKU the branch does not sell', async () => {
    const m = await merchant();
    await t
      .db('branch_products')
      .where({ branch_id: m.branchId, product_id: m.product('TRS-RHR-SG') })
      .update({ reserved: 50 });
    const exported = (await m.yard.get(`/api/branches/${m.branchId}/stock-counts`)).text;
    expect(exported.split('\r\n')[0]).toBe('\uFEFFsku,name,unit,on_hand,reserved,available,reorder_level');
    const before = await t.db('branch_products').where({ branch_id: m.branchId }).orderBy('id');
    const bad = await upload(m.yard, `/api/branches/${m.branchId}/stock-counts`, 'sku,on_hand\nTRS-FL420-SG,5000\nTRS-RHR-SG,10\nCTT-WL380-RU,5\nTRS-BAT-3825,12.5\n');
    expect(bad.body.error.details.map((d: { row: number; column: string }) => [d.row, d.column])).toEqual([
      [3, 'on_hand'],
      [4, 'sku'],
      [5, 'on_hand'],
    ]);
    expect(await t.db('branch_products').where({ branch_id: m.branchId }).orderBy('id')).toEqual(before);
    const ok = await upload(m.yard, `/api/branches/${m.branchId}/stock-counts`, 'sku,on_hand,reorder_level\nTRS-FL420-SG,5000,900\nTRS-RHR-SG,60,\n');
    expect(ok.body).toMatchObject({ rows: 2, updated: 2 });
    expect(
      await t
        .db('branch_products')
        .where({ branch_id: m.branchId, product_id: m.product('TRS-FL420-SG') })
        .first(),
    ).toMatchObject({ on_hand: 5000, reorder_level: 900 });
  });
});

describe('no role reaches another merchant’s catalogue, prices or stock', () => {
  for (const role of ROLES) {
    it(`${role}: every read and change is refused and nothing changes`, async () => {
      const m = await merchant();
      const productId = m.product('TRS-FL420-SG');
      const systemId = m.systemIds[0].id;
      const snapshot = async () => ({
        products: await t.db('products').where({ organisation_id: m.organisationId }).orderBy('id'),
        prices: await t.db('branch_products').where({ branch_id: m.branchId }).orderBy('id'),
        systems: await t.db('roof_systems').where({ organisation_id: m.organisationId }).orderBy('id'),
      });
      const before = await snapshot();
      const actor = await makeOrgWithUser(t.db, kindOfRole(role), role);
      const c = await login(actor.email);
      const attempts = [
        await c.get(`/api/products/${productId}`),
        await c.patch(`/api/products/${productId}`, { name: 'hijack' }),
        await c.delete(`/api/products/${productId}`),
        await c.send('put', `/api/branches/${m.branchId}/products/${productId}`, { pack_price: 1 }),
        await c.get(`/api/roof-systems/${systemId}`),
        await c.patch(`/api/roof-systems/${systemId}`, { name: 'hijack' }),
        await c.delete(`/api/roof-systems/${systemId}`),
        await c.post('/api/roof-systems', { branch_id: m.branchId, name: 'x', components: {} }),
        await c.get(`/api/branches/${m.branchId}/price-list`),
        await upload(c, `/api/branches/${m.branchId}/price-list`, 'sku,price\nTRS-FL420-SG,0.01\n'),
        await c.get(`/api/branches/${m.branchId}/stock`),
        await c.patch(`/api/branches/${m.branchId}/stock/${productId}`, { on_hand: 1 }),
        await c.get(`/api/branches/${m.branchId}/stock-counts`),
        await upload(c, `/api/branches/${m.branchId}/stock-counts`, 'sku,on_hand\nTRS-FL420-SG,1\n'),
      ];
      for (const res of attempts) expect([403, 404], `${role}: ${res.status} ${JSON.stringify(res.body.error)}`).toContain(res.status);
      expect(await snapshot()).toEqual(before);
      const own = await c.get('/api/products');
      if (own.status === 200) expect(own.body.products).toEqual([]);
    });
  }
});
