import { databaseFingerprint } from '../setup/db-fingerprint';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MAX_SCHEDULE_BYTES } from '../../shared/schemas/schedule-upload.schema';
import { MAX_SHEET_BYTES } from '../../shared/schemas/price-list.schema';
import { Client, createTestApp, type TestApp } from '../setup/test-app';
import { GABLE_CSV, signIn } from '../setup/scenario';
import { tradingPair, type TradingPair } from '../setup/two-firms-world';

/**
 * A table of bad inputs over the write routes and the uploads. Each row says who sends what and the
 * answer it must get (status, code, and the message or the field named); after each row the whole
 * database is compared with how it was, so a refused request never leaves half a change behind.
 */

let t: TestApp;
let w: TradingPair;
type Who = 'estimator' | 'desk' | 'yard' | 'owner' | 'anon';
const clients = new Map<Who, Client>();

beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '10000', RESET_RATE_LIMIT: '10000' });
  w = await tradingPair(t, 0);
  clients.set('estimator', w.k.c);
  clients.set('desk', await signIn(t.app, w.m.salesEmail));
  clients.set('yard', await signIn(t.app, w.m.dispatcherEmail));
  clients.set('owner', await signIn(t.app, w.m.ownerEmail));
  clients.set('anon', new Client(t.app));
}, 120_000);
afterAll(async () => t.close());

async function fingerprint(): Promise<string> {
  return databaseFingerprint(t.db, ['sessions', 'rate_limit_hits', 'dev_outbox']);
}

interface Row {
  name: string;
  as: Who;
  method: 'post' | 'put' | 'patch';
  path: () => string;
  json?: unknown;
  raw?: { type: string; data: string | Buffer };
  file?: { field: string; filename: string; data: string | Buffer; type: string };
  status: number;
  code: string;
  /** The message, or the field the first detail names. */
  message?: RegExp;
  field?: string | RegExp;
}

/** Write routes with a body that must carry required fields, each with a body that would be accepted. */
const TARGETS: { label: string; as: Who; method: Row['method']; path: () => string; valid: () => Record<string, unknown>; text: string }[] = [
  { label: 'new site', as: 'estimator', method: 'post', path: () => '/api/projects', valid: () => ({ name: 'Marlpit Row', site_address: '2 Marlpit Row, Dunsworth' }), text: 'name' },
  { label: 'site edit', as: 'estimator', method: 'patch', path: () => `/api/projects/${w.ids.projectId}`, valid: () => ({ revision: 1, contact_name: 'Ivo Penrake' }), text: 'contact_name' },
  {
    label: 'new order',
    as: 'estimator',
    method: 'post',
    path: () => '/api/orders',
    valid: () => ({ estimate_id: w.ids.estimateId, branch_id: w.ids.branchId, requested_date: t.config.calendar.fromToday(7), delivery_method: 'ground', notes: 'Gate code 4411' }),
    text: 'notes',
  },
  {
    label: 'desk offer',
    as: 'desk',
    method: 'post',
    path: () => `/api/orders/${w.ids.orderId}/proposals`,
    valid: () => ({ revision: 1, message: 'One day later', proposed_date: t.config.calendar.fromToday(8) }),
    text: 'message',
  },
  { label: 'order change', as: 'estimator', method: 'patch', path: () => `/api/orders/${w.ids.orderId}`, valid: () => ({ revision: 1, notes: 'Ring first' }), text: 'notes' },
  {
    label: 'quote request',
    as: 'estimator',
    method: 'post',
    path: () => '/api/quote-requests',
    valid: () => ({ estimate_id: w.ids.estimateId, branch_ids: [w.ids.branchId], requested_date: t.config.calendar.fromToday(9), delivery_method: 'ground', notes: 'Prices please' }),
    text: 'notes',
  },
  { label: 'order comment', as: 'estimator', method: 'post', path: () => `/api/orders/${w.ids.orderId}/comments`, valid: () => ({ body: 'Is Tuesday possible?' }), text: 'body' },
  { label: 'invitation', as: 'owner', method: 'post', path: () => '/api/invitations', valid: () => ({ email: 'new.hand@dunsworth.test', role: 'merchant_sales' }), text: 'email' },
  {
    label: 'new product',
    as: 'desk',
    method: 'post',
    path: () => '/api/products',
    valid: () => ({ sku: 'CORPUS-1', name: 'Corpus tile', category: 'accessory', unit: 'each', pack_size: 1, pack_weight_kg: 1 }),
    text: 'name',
  },
  {
    label: 'new lorry',
    as: 'yard',
    method: 'post',
    path: () => `/api/branches/${w.ids.branchId}/lorries`,
    valid: () => ({ name: 'Corpus rigid', registration: 'CP-01X', payload_kg: 9000, pallet_slots: 8 }),
    text: 'name',
  },
  {
    label: 'credit note',
    as: 'desk',
    method: 'post',
    path: () => `/api/invoices/${w.ids.invoiceId}/credit-notes`,
    valid: () => ({ reason: 'damage', notes: 'Two broken', lines: [{ invoice_line_id: w.ids.invoiceLineId, quantity: 1 }] }),
    text: 'notes',
  },
  {
    label: 'sign-up',
    as: 'anon',
    method: 'post',
    path: () => '/api/auth/signup',
    valid: () => ({ organisation_name: 'Corpus Roofing', kind: 'contractor', name: 'Wren Alder', email: 'wren@corpus.test', password: 'a-long-enough-password' }),
    text: 'organisation_name',
  },
  { label: 'sign-in', as: 'anon', method: 'post', path: () => '/api/auth/login', valid: () => ({ email: 'nobody@corpus.test', password: 'whatever-it-is' }), text: 'email' },
  { label: 'password reset', as: 'anon', method: 'post', path: () => '/api/auth/password/reset', valid: () => ({ token: 'x'.repeat(43), password: 'a-long-enough-password' }), text: 'token' },
];

const deep = (n: number) => `{"x":${'['.repeat(n)}${']'.repeat(n)}}`;
const MALFORMED = { code: 'malformed_json', message: /not valid JSON/ };
const INVALID = { code: 'validation_failed', message: /not valid/ };

/** Bad shapes that every JSON write route must refuse without a change. */
function genericRows(): Row[] {
  return TARGETS.flatMap((x) => {
    const base = { as: x.as, method: x.method, path: x.path };
    const withText = (v: unknown) => ({ ...x.valid(), [x.text]: v });
    const rows: Row[] = [
      // Bytes that are not text at all never reach a field: the required fields are missing.
      { ...base, name: `${x.label}: binary bytes sent as JSON`, raw: { type: 'application/json', data: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x9c]) }, status: 422, ...INVALID },
      { ...base, name: `${x.label}: JSON cut short`, raw: { type: 'application/json', data: '{"name": "Marl' }, status: 400, ...MALFORMED },
      { ...base, name: `${x.label}: a bare null`, raw: { type: 'application/json', data: 'null' }, status: 400, ...MALFORMED },
      { ...base, name: `${x.label}: 5,000-deep JSON`, raw: { type: 'application/json', data: deep(5000) }, status: 422, ...INVALID, field: /^x\.0\.0/ },
      { ...base, name: `${x.label}: a body over 1 MB`, raw: { type: 'application/json', data: JSON.stringify(withText('a'.repeat(1_100_000))) }, status: 413, code: 'payload_too_large', message: /too large/ },
      { ...base, name: `${x.label}: a __proto__ key`, raw: { type: 'application/json', data: JSON.stringify(x.valid()).replace(/^\{/, '{"__proto__":{"admin":true},') }, status: 422, ...INVALID, field: '__proto__' },
      { ...base, name: `${x.label}: constructor.prototype keys`, json: { ...x.valid(), constructor: { prototype: { admin: true } } }, status: 422, ...INVALID, field: 'constructor' },
      { ...base, name: `${x.label}: an array instead of an object`, json: [x.valid()], status: 422, ...INVALID },
      { ...base, name: `${x.label}: a NUL in ${x.text}`, json: withText('Marl\u0000pit'), status: 422, ...INVALID, field: x.text },
      { ...base, name: `${x.label}: an escape sequence in ${x.text}`, json: withText('\u001b[2J\u001b[Hcleared'), status: 422, ...INVALID, field: x.text },
      { ...base, name: `${x.label}: a number where text belongs`, json: withText(12), status: 422, ...INVALID, field: x.text },
    ];
    // A JSON body labelled as something else arrives as no body at all: the required fields are missing.
    rows.push({
      ...base,
      name: `${x.label}: JSON sent as text/plain`,
      raw: { type: 'text/plain', data: JSON.stringify(x.valid()) },
      status: x.label === 'sign-in' || x.label === 'password reset' || x.label === 'sign-up' ? 422 : 422,
      ...INVALID,
    });
    return rows;
  });
}

/** Field by field: numbers that are not numbers, impossible dates, huge strings, ids that are not ids. */
function fieldRows(): Row[] {
  const order = TARGETS.find((x) => x.label === 'new order')!;
  const product = TARGETS.find((x) => x.label === 'new product')!;
  const lorry = TARGETS.find((x) => x.label === 'new lorry')!;
  const site = TARGETS.find((x) => x.label === 'new site')!;
  const credit = TARGETS.find((x) => x.label === 'credit note')!;
  const row = (x: (typeof TARGETS)[number], name: string, over: Record<string, unknown>, field: string | RegExp, raw?: string): Row => ({
    name: `${x.label}: ${name}`,
    as: x.as,
    method: x.method,
    path: x.path,
    ...(raw ? { raw: { type: 'application/json', data: raw } } : { json: { ...x.valid(), ...over } }),
    status: 422,
    ...INVALID,
    field,
  });
  const rows: Row[] = [];
  for (const d of ['2027-02-30', '2027-13-01', '2027-00-10', '27-01-10', 'tomorrow', '2027-1-5', '9999-12-31', '0000-01-01', '', '2027-01-10T00:00:00Z'])
    rows.push(row(order, `requested_date ${JSON.stringify(d)}`, { requested_date: d }, 'requested_date'));
  for (const id of ['1', '0x1', 1.5, -1, 0, '1 OR 1=1', "1'; DROP TABLE orders;--", 1e21]) rows.push(row(order, `estimate_id ${JSON.stringify(id)}`, { estimate_id: id }, 'estimate_id'));
  rows.push(row(order, 'estimate_id as a huge number literal', {}, 'estimate_id', JSON.stringify(order.valid()).replace(/"estimate_id":\d+/, '"estimate_id":1e999')));
  for (const v of [-1, 0.5, Infinity, '12', null])
    rows.push(row(product, `pack_size ${String(v)}`, { pack_size: v }, 'pack_size', v === Infinity ? JSON.stringify(product.valid()).replace(/"pack_size":\d+/, '"pack_size":1e999') : undefined));
  for (const v of [-100, 0, 1e9, 'heavy', NaN]) rows.push(row(lorry, `payload_kg ${String(v)}`, { payload_kg: Number.isNaN(v) ? 'NaN' : v }, 'payload_kg'));
  for (const v of [-1, 0, 2.5, '1']) rows.push(row(credit, `credit quantity ${String(v)}`, { lines: [{ invoice_line_id: w.ids.invoiceLineId, quantity: v }] }, 'lines.0.quantity'));
  rows.push(row(site, 'a 100,000-character name', { name: 'n'.repeat(100_000) }, 'name'));
  rows.push(row(site, 'a 50,000-character address', { site_address: 'a'.repeat(50_000) }, 'site_address'));
  rows.push(row(site, '501 buildings', { buildings: Array.from({ length: 501 }, (_, i) => ({ name: `Plot ${i}` })) }, 'buildings'));
  rows.push(row(site, 'a DEL character in the name', { name: 'Marl\u007fpit' }, 'name'));
  rows.push(row(site, 'a control character in a building name', { buildings: [{ name: 'Plot\u00071' }] }, 'buildings.0.name'));
  rows.push(row(site, 'an unknown access word', { vehicle_access: 'helicopter' }, 'vehicle_access'));
  return rows;
}

/** Uploads: oversize, binary, lying types, formula cells, wrong columns. */
function uploadRows(): Row[] {
  const schedule = () => `/api/projects/${w.ids.projectId}/schedule`;
  const prices = () => `/api/branches/${w.ids.branchId}/price-list`;
  const counts = () => `/api/branches/${w.ids.branchId}/stock-counts`;
  const big = (n: number) => 'sku,price,tax_rate\n' + 'TRS-FL420-SG,1.30,20\n'.repeat(Math.ceil(n / 21));
  const randomBytes = Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 7919 + 13) % 256));
  const up = (name: string, who: Who, path: () => string, data: string | Buffer, type: string, status: number, code: string, message?: RegExp): Row => ({
    name,
    as: who,
    method: 'post',
    path,
    raw: { type, data },
    status,
    code,
    message,
  });
  const form = (name: string, who: Who, path: () => string, filename: string, data: string | Buffer, type: string, status: number, code: string, message?: RegExp): Row => ({
    name,
    as: who,
    method: 'post',
    path,
    file: { field: 'file', filename, data, type },
    status,
    code,
    message,
  });
  return [
    up('schedule over 5 MB', 'estimator', schedule, GABLE_CSV + 'x'.repeat(MAX_SCHEDULE_BYTES), 'text/csv', 413, 'payload_too_large', /too large/),
    form('schedule file over 5 MB', 'estimator', schedule, 'roof.csv', GABLE_CSV + 'x'.repeat(MAX_SCHEDULE_BYTES), 'text/csv', 413, 'payload_too_large', /too large/),
    up('schedule as binary bytes', 'estimator', schedule, randomBytes, 'text/csv', 422, 'invalid_schedule'),
    up('schedule sent as JSON', 'estimator', schedule, JSON.stringify({ faces: [] }), 'application/json', 415, 'unsupported_media_type', /text\/csv/),
    up('schedule sent as an image', 'estimator', schedule, randomBytes, 'image/png', 415, 'unsupported_media_type'),
    up('schedule with a NUL in a name', 'estimator', schedule, GABLE_CSV.replace('House,Front', 'Ho\u0000use,Front'), 'text/csv', 422, 'invalid_schedule'),
    up('schedule with only a header', 'estimator', schedule, GABLE_CSV.split('\n')[0] + '\n', 'text/csv', 422, 'invalid_schedule'),
    up('schedule with a negative eaves length', 'estimator', schedule, GABLE_CSV.replace(',8000,', ',-8000,'), 'text/csv', 422, 'invalid_schedule'),
    up('schedule with NaN as a pitch', 'estimator', schedule, GABLE_CSV.replace(',40,', ',NaN,'), 'text/csv', 422, 'invalid_schedule'),
    up('schedule with Infinity as a rafter', 'estimator', schedule, GABLE_CSV.replace(',5000,', ',Infinity,'), 'text/csv', 422, 'invalid_schedule'),
    form('schedule form without the file', 'estimator', schedule, '', '', 'text/csv', 422, 'invalid_schedule'),
    up('price list over 5 MB', 'desk', prices, big(MAX_SHEET_BYTES + 10), 'text/csv', 413, 'payload_too_large', /too large/),
    up('price list as binary bytes', 'desk', prices, randomBytes, 'text/csv', 422, 'invalid_sheet'),
    up('price list sent as JSON', 'desk', prices, JSON.stringify([{ sku: 'TRS-FL420-SG', price: 1.3 }]), 'application/json', 415, 'unsupported_media_type'),
    up('price list with a NUL in a cell', 'desk', prices, 'sku,price,tax_rate\nTRS-FL420-SG\u0000,1.30,20\n', 'text/csv', 422, 'invalid_sheet', /Nothing was changed/),
    up('price list as a broken zip', 'desk', prices, Buffer.concat([Buffer.from('PK\u0003\u0004'), randomBytes]), 'application/octet-stream', 422, 'invalid_sheet', /Nothing was changed/),
    up('price list with a formula name', 'desk', prices, 'sku,price,tax_rate\n=HYPERLINK("http://x.test"),1.30,20\n', 'text/csv', 422, 'invalid_sheet'),
    up('price list with a negative price', 'desk', prices, 'sku,price,tax_rate\nTRS-FL420-SG,-1.30,20\n', 'text/csv', 422, 'invalid_sheet'),
    up('price list with NaN as a price', 'desk', prices, 'sku,price,tax_rate\nTRS-FL420-SG,NaN,20\n', 'text/csv', 422, 'invalid_sheet'),
    up('price list without its columns', 'desk', prices, 'product,cost\nTRS-FL420-SG,1.30\n', 'text/csv', 422, 'invalid_sheet'),
    up('stock counts with a negative count', 'yard', counts, 'sku,on_hand\nTRS-FL420-SG,-5\n', 'text/csv', 422, 'invalid_sheet'),
    up('stock counts with Infinity', 'yard', counts, 'sku,on_hand\nTRS-FL420-SG,Infinity\n', 'text/csv', 422, 'invalid_sheet'),
    up('stock counts with an unknown SKU', 'yard', counts, "sku,on_hand\n'; DELETE FROM products;--,5\n", 'text/csv', 422, 'invalid_sheet'),
  ];
}

/** Built once the world exists: some rows name its records. */
const corpus = () => [...genericRows(), ...fieldRows(), ...uploadRows()];

async function sendRow(r: Row) {
  const c = clients.get(r.as)!;
  const token = await c.csrf();
  const req = c.agent[r.method](r.path()).set('X-CSRF-Token', token);
  if (r.file) return r.file.filename ? req.attach(r.file.field, Buffer.from(r.file.data), { filename: r.file.filename, contentType: r.file.type }) : req.field('note', 'no file');
  if (r.raw) return req.set('Content-Type', r.raw.type).send(r.raw.data);
  return req.send(r.json as object);
}

describe('the bad-input corpus', () => {
  it('holds at least 150 rows, each named once', () => {
    const ROWS = corpus();
    expect(ROWS.length).toBeGreaterThanOrEqual(150);
    expect(new Set(ROWS.map((r) => r.name)).size).toBe(ROWS.length);
  });

  it('answers every row with its status, code and message or field, and changes nothing', async () => {
    const wrong: string[] = [];
    let before = await fingerprint();
    for (const r of corpus()) {
      const res = await sendRow(r);
      const err = res.body?.error as { code?: string; message?: string; details?: { path?: string; column?: string }[] } | undefined;
      const problems: string[] = [];
      if (res.status !== r.status) problems.push(`status ${res.status}`);
      if (err?.code !== r.code) problems.push(`code ${err?.code}`);
      if (r.message && !r.message.test(err?.message ?? '')) problems.push(`message ${err?.message}`);
      if (r.field !== undefined) {
        const first = err?.details?.[0]?.path ?? '';
        if (typeof r.field === 'string' ? first !== r.field : !r.field.test(first)) problems.push(`field ${first}`);
      }
      const after = await fingerprint();
      if (after !== before) problems.push('the database changed');
      before = after;
      if (problems.length) wrong.push(`${r.name}: ${problems.join(', ')} — ${JSON.stringify(res.body).slice(0, 160)}`);
    }
    expect(wrong).toEqual([]);
  }, 120_000);
});

describe('the corpus’s own bodies', () => {
  it('are accepted as they are, so each bad row is refused for the one thing it changes', async () => {
    const expected: Record<string, number> = { 'sign-in': 401, 'password reset': 400 };
    const wrong: string[] = [];
    for (const x of TARGETS) {
      const c = clients.get(x.as)!;
      await c.csrf();
      const res = await c.send(x.method, x.path(), x.valid());
      const want = expected[x.label];
      if (want ? res.status !== want : res.status >= 300) wrong.push(`${x.label}: ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`);
    }
    expect(wrong).toEqual([]);
  });
});

describe('text that must be kept exactly as typed', () => {
  const KEPT = [
    ['right-to-left', 'موقع البناء ٣ — שלב ב'],
    ['emoji', 'Plot 3 🏠🧱 — ridge 🔺'],
    ['combining accents', 'Llŷn Cottages, Pen-y-bryn'],
    ['formula text', '=HYPERLINK("http://example.test","open")'],
    ['a leading plus, minus and at sign', '+44 row / -west / @yard'],
    ['SQL-looking text', "Robert'); DROP TABLE projects;--"],
    ['a tab and a line break', 'Gate A\tcode 1234\nthen left'],
  ] as const;
  for (const [label, text] of KEPT) {
    it(`stores ${label} in a site’s name, notes and building name and reads it back unchanged`, async () => {
      const res = await w.k.c.post('/api/projects', { name: text.replace(/[\t\n]/g, ' '), site_address: '1 Test Row', access_notes: text, buildings: [{ name: text.replace(/[\t\n]/g, ' ').slice(0, 100), notes: text }] });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const back = (await w.k.c.get(`/api/projects/${res.body.id}`)).body;
      expect(back.name).toBe(text.replace(/[\t\n]/g, ' ').trim());
      expect(back.access_notes).toBe(text.trim());
      expect(back.buildings[0].notes).toBe(text.trim());
    });
  }

  it('keeps only the file’s own name when an upload names folders (../../)', async () => {
    for (const filename of ['../../../etc/passwd.csv', '..\\..\\windows\\roof.csv']) {
      const token = await w.k.c.csrf();
      const res = await w.k.c.agent.post(`/api/projects/${w.ids.projectId}/schedule`).set('X-CSRF-Token', token).attach('file', Buffer.from(GABLE_CSV), { filename, contentType: 'text/csv' });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const stored = await t.db('schedules').where({ project_id: w.ids.projectId }).orderBy('version', 'desc').first();
      expect(stored.filename).toBe(filename.endsWith('passwd.csv') ? 'passwd.csv' : 'roof.csv');
    }
  });
});
