import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, kindOfRole } from '../../shared/domain/roles';
import { EXAMPLE_OPENINGS_CSV } from '../../shared/engine/example-openings';
import { EXAMPLE_SCHEDULE_CSV } from '../../shared/engine/example-schedule';
import { parseScheduleCsv } from '../../shared/engine/schedule-parse';
import { errorBodySchema } from '../../shared/schemas/error.schema';
import { MAX_SCHEDULE_BYTES, scheduleHistorySchema, scheduleResponseSchema } from '../../shared/schemas/schedule-upload.schema';
import { Client, createTestApp, type TestApp } from '../setup/test-app';
import { makeOrgWithUser, TEST_PASSWORD } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '1000' });
});
afterAll(async () => t.close());

const HEADER = 'building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top';

async function signedIn(kind: 'contractor' | 'merchant' = 'contractor', role: (typeof ROLES)[number] = 'contractor_estimator') {
  const u = await makeOrgWithUser(t.db, kind, role);
  const c = new Client(t.app);
  expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
  return { ...u, c };
}

async function siteOf(c: Client, name = 'Lowther Fold') {
  const res = await c.post('/api/projects', { name, site_address: '1 Lowther Fold, Brindlecombe' });
  expect(res.status).toBe(201);
  return res.body.id as number;
}

async function sendCsv(c: Client, projectId: number, body: string | Buffer, type = 'text/csv') {
  const token = await c.csrf();
  return c.agent.post(`/api/projects/${projectId}/schedule`).set('X-CSRF-Token', token).set('Content-Type', type).send(body);
}

async function sendFile(c: Client, projectId: number, body: string | Buffer, filename = 'roofs.csv', field = 'file') {
  const token = await c.csrf();
  return c.agent
    .post(`/api/projects/${projectId}/schedule`)
    .set('X-CSRF-Token', token)
    .attach(field, Buffer.isBuffer(body) ? body : Buffer.from(body, 'utf8'), { filename, contentType: 'text/csv' });
}

/** What is stored for a site: its schedule versions and their faces. */
async function stored(projectId: number) {
  const versions = await t.db('schedules').where({ project_id: projectId }).count({ n: '*' }).first();
  const faces = await t.db('schedule_faces as f').join('schedules as s', 's.id', 'f.schedule_id').where('s.project_id', projectId).count({ n: '*' }).first();
  return { versions: Number(versions?.n), faces: Number(faces?.n) };
}

function expectInvalid(res: request.Response) {
  expect(res.status).toBe(422);
  const body = errorBodySchema.parse(res.body);
  expect(body.error.code).toBe('invalid_schedule');
  return body.error.details ?? [];
}

describe('importing a schedule as CSV', () => {
  it('stores the example schedule sent as text/csv, one face per row with derived rafters', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const res = await sendCsv(c, id, EXAMPLE_SCHEDULE_CSV);
    expect(res.status).toBe(201);
    const s = scheduleResponseSchema.parse(res.body);
    expect(s).toMatchObject({ version: 1, source: 'csv', face_count: 7 });
    expect(s.faces.map((f) => `${f.building}/${f.face}`)).toEqual(['Alder/Front', 'Alder/Back', 'Alder/East hip end', 'Alder/West hip end', 'Birch/Front', 'Birch/Back', 'Birch/Porch']);
    // A run of 4200 mm at 35° is a rafter of 4200 ÷ cos 35° (slope factor 1.2208, trigonometry; TRADE.md Geometry).
    expect(s.faces[0].rafter_mm).toBeCloseTo(4200 * 1.2208, -1);
    expect(s.faces[0]).toMatchObject({ quantity: 12, pitch_deg: 35, run_mm: 4200, eaves_mm: 10200, top_mm: 1800, left: 'hip', right: 'hip', top: 'ridge' });
    // The stored faces are exactly what the shared parser reads from the same file.
    const parsed = parseScheduleCsv(EXAMPLE_SCHEDULE_CSV);
    if (!parsed.ok) throw new Error('example does not parse');
    expect(s.faces.map(({ id: _i, position: _p, top_assumed: _t, ridge, ...f }) => (ridge === null ? f : { ...f, ridge }))).toEqual(parsed.faces);
    expect(s.faces[0]).toMatchObject({ ridge: 'Main', top_assumed: false });
    expect(s.openings).toEqual([]);
    expect(await stored(id)).toEqual({ versions: 1, faces: 7 });
  });

  it('takes the same file as the multipart field "file", keeps its name, and keeps the earlier version in the history', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    expect((await sendCsv(c, id, EXAMPLE_SCHEDULE_CSV)).status).toBe(201);
    const second = EXAMPLE_SCHEDULE_CSV.replace('Birch,Porch,8,', 'Birch,Porch,9,');
    const res = await sendFile(c, id, second, 'plots-13-20.csv');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ version: 2, filename: 'plots-13-20.csv' });

    const current = await c.get(`/api/projects/${id}/schedule`);
    expect(current.body.version).toBe(2);
    expect(current.body.faces.find((f: { face: string }) => f.face === 'Porch').quantity).toBe(9);
    const history = scheduleHistorySchema.parse((await c.get(`/api/projects/${id}/schedules`)).body);
    expect(history.schedules.map((v) => v.version)).toEqual([2, 1]);
    const first = await c.get(`/api/projects/${id}/schedules/1`);
    expect(first.body.faces.find((f: { face: string }) => f.face === 'Porch').quantity).toBe(8);
    expect((await c.get(`/api/projects/${id}`)).body.schedule).toMatchObject({ version: 2, face_count: 7 });
  });

  it('reads a file saved with a UTF-8 byte-order mark the same as one without', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const res = await sendFile(c, id, Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(EXAMPLE_SCHEDULE_CSV)]));
    expect(res.status).toBe(201);
    expect(res.body.faces[0].building).toBe('Alder');
    expect(res.body.face_count).toBe(7);
  });

  it('reads a semicolon-delimited export with decimal commas', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const csv = ['building;face;quantity;pitch_deg;rafter_mm;eaves_mm;left;right;top', 'A;Front;1;37,5;4200;9000;verge;verge;ridge', ''].join('\n');
    const res = await sendCsv(c, id, csv);
    expect(res.status).toBe(201);
    expect(res.body.faces[0].pitch_deg).toBe(37.5);
  });

  it('rejects a file with an unreadable delimiter, naming the header row, and stores nothing', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const details = expectInvalid(await sendCsv(c, id, EXAMPLE_SCHEDULE_CSV.replace(/,/g, '|')));
    expect(details[0]).toMatchObject({ row: 1 });
    expect(details[0].message).toMatch(/header/);
    expect(await stored(id)).toEqual({ versions: 0, faces: 0 });
  });

  it('rejects metres typed into millimetre columns, naming row and column, and stores nothing', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const csv = [HEADER, 'A,Front,1,35,5.1,,10.2,,verge,verge,ridge', 'A,Back,1,35,5100,,10200,,verge,verge,ridge', ''].join('\n');
    const details = expectInvalid(await sendCsv(c, id, csv));
    expect(details).toEqual([
      { row: 2, column: 'rafter_mm', message: expect.stringMatching(/metres.*5100/) },
      { row: 2, column: 'eaves_mm', message: expect.stringMatching(/metres.*10200/) },
    ]);
    expect(await stored(id)).toEqual({ versions: 0, faces: 0 });
  });

  it('rejects a file missing a required column, naming the column', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const csv = ['building,face,quantity,pitch_deg,rafter_mm,left,right,top', 'A,Front,1,35,4200,verge,verge,ridge', ''].join('\n');
    const details = expectInvalid(await sendCsv(c, id, csv));
    expect(details).toContainEqual(expect.objectContaining({ row: 1, column: 'eaves_mm' }));
    expect(await stored(id)).toEqual({ versions: 0, faces: 0 });
  });

  it('lists every bad row at once, and one bad row keeps the good rows out too', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const csv = [HEADER, 'A,Front,1,35,5100,,10200,,verge,verge,ridge', 'A,Back,0,35,5100,,10200,,verge,verge,ridge', 'A,Side,1,95,5100,,10200,,verge,verge,ridge', 'A,Lean,1,35,5100,,10200,,verge,gutter,ridge', ''].join(
      '\n',
    );
    const details = expectInvalid(await sendCsv(c, id, csv));
    expect(details.map((d) => [d.row, d.column])).toEqual([
      [3, 'quantity'],
      [4, 'pitch_deg'],
      [5, 'right'],
    ]);
    expect(await stored(id)).toEqual({ versions: 0, faces: 0 });
  });

  it('stores formula-looking names as plain text but rejects a formula in a number column', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const named = [HEADER, '"=HYPERLINK(""http://evil.test"",""x"")",@SUM(A1),1,35,5100,,10200,,verge,verge,ridge', ''].join('\n');
    const ok = await sendCsv(c, id, named);
    expect(ok.status).toBe(201);
    expect(ok.body.faces[0]).toMatchObject({ building: '=HYPERLINK("http://evil.test","x")', face: '@SUM(A1)' });

    const numeric = [HEADER, 'A,Front,1,=1+34,5100,,10200,,verge,verge,ridge', ''].join('\n');
    const details = expectInvalid(await sendCsv(c, id, numeric));
    expect(details[0]).toMatchObject({ row: 2, column: 'pitch_deg' });
    expect(await stored(id)).toEqual({ versions: 1, faces: 1 });
  });

  it('refuses a file over 5 MB with 413, as a body or as a file, and stores nothing', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const row = 'A,Front,1,35,5100,,10200,,verge,verge,ridge\n';
    const big = HEADER + '\n' + row.repeat(Math.ceil(MAX_SCHEDULE_BYTES / row.length) + 10);
    expect(Buffer.byteLength(big)).toBeGreaterThan(MAX_SCHEDULE_BYTES);
    const asBody = await sendCsv(c, id, big);
    expect(asBody.status).toBe(413);
    expect(asBody.body.error.code).toBe('payload_too_large');
    const asFile = await sendFile(c, id, big);
    expect(asFile.status).toBe(413);
    expect(await stored(id)).toEqual({ versions: 0, faces: 0 });
  });

  it('rejects text that is not UTF-8, a JSON body, and a file in the wrong form field, storing nothing', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const latin1 = Buffer.from(`${HEADER}\nCaf\xe9,Front,1,35,5100,,10200,,verge,verge,ridge\n`, 'latin1');
    expect(expectInvalid(await sendFile(c, id, latin1))[0].message).toMatch(/UTF-8/);
    const json = await c.post(`/api/projects/${id}/schedule`, { faces: [] });
    expect(json.status).toBe(415);
    expect(expectInvalid(await sendFile(c, id, EXAMPLE_SCHEDULE_CSV, 'roofs.csv', 'upload'))[0].message).toMatch(/file/);
    expect(await stored(id)).toEqual({ versions: 0, faces: 0 });
  });

  it('refuses to add a schedule to an archived site', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    await c.post(`/api/projects/${id}/archive`);
    const res = await sendCsv(c, id, EXAMPLE_SCHEDULE_CSV);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('project_archived');
    expect(await stored(id)).toEqual({ versions: 0, faces: 0 });
  });

  it('answers 404 no_schedule for a site without one', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const res = await c.get(`/api/projects/${id}/schedule`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('no_schedule');
    // A page that only asks whether there is one gets "none" as an answer, not a failed request.
    const optional = await c.get(`/api/projects/${id}/schedule?optional=1`);
    expect(optional.status).toBe(200);
    expect(optional.body).toBeNull();
  });
});

describe('faces entered or edited by hand', () => {
  it('saves the whole face list as a new version, checked by the same rules', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    await sendCsv(c, id, EXAMPLE_SCHEDULE_CSV);
    const res = await c.send('put', `/api/projects/${id}/schedule`, {
      faces: [
        { building: 'Garage', face: 'Roof', pitch_deg: 40, rafter_mm: 3000, eaves_mm: 6000 },
        { building: 'Garage', face: 'Lean-to', pitch_deg: 30, run_mm: 1500, eaves_mm: 3000, top: 'abutment' },
      ],
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ version: 2, source: 'form', face_count: 2 });
    expect(res.body.faces[0]).toMatchObject({ quantity: 1, left: 'verge', right: 'verge', top: 'ridge', top_mm: 6000 });
    expect(res.body.faces[1].rafter_mm).toBeCloseTo(1500 / Math.cos(Math.PI / 6), 6);
  });

  it('rejects bad faces with entry number, column and path, storing nothing', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const res = await c.send('put', `/api/projects/${id}/schedule`, {
      faces: [
        { building: 'A', face: 'Front', pitch_deg: 35, rafter_mm: 5100, eaves_mm: 10200 },
        { building: 'A', face: 'Back', pitch_deg: 35, rafter_mm: 5.1, eaves_mm: 10200 },
        { building: 'A', face: 'front', pitch_deg: 35, rafter_mm: 5100, eaves_mm: 10200 },
      ],
    });
    const details = expectInvalid(res);
    expect(details).toEqual([
      { row: 2, column: 'rafter_mm', path: 'faces.1.rafter_mm', message: expect.stringMatching(/metres/) },
      { row: 3, column: 'face', path: 'faces.2.face', message: expect.stringMatching(/duplicate/) },
    ]);
    expect(await stored(id)).toEqual({ versions: 0, faces: 0 });
    expect((await c.send('put', `/api/projects/${id}/schedule`, { faces: [] })).status).toBe(422);
  });
});

describe('ridges and openings stored with the schedule version', () => {
  async function sendOpenings(c: Client, projectId: number, body: string) {
    const token = await c.csrf();
    return c.agent.post(`/api/projects/${projectId}/schedule/openings`).set('X-CSRF-Token', token).set('Content-Type', 'text/csv').send(body);
  }

  it('imports an openings file for the current faces as a new version, and estimates with it', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    expect((await sendCsv(c, id, EXAMPLE_SCHEDULE_CSV)).status).toBe(201);
    const res = await sendOpenings(c, id, EXAMPLE_OPENINGS_CSV);
    expect(res.status).toBe(201);
    const s = scheduleResponseSchema.parse(res.body);
    expect(s.version).toBe(2);
    expect(s.faces).toHaveLength(7);
    expect(s.openings.map(({ id: _i, position: _p, ...o }) => o)).toEqual([
      { building: 'Alder', face: 'Back', kind: 'roof_window', width_mm: 780, height_mm: 1180, quantity: 2 },
      { building: 'Birch', face: 'Front', kind: 'chimney', width_mm: 900, height_mm: 700, quantity: 1 },
      { building: 'Birch', face: 'Back', kind: 'hatch', width_mm: 600, height_mm: 900, quantity: 1 },
    ]);
    const e = await c.post(`/api/projects/${id}/estimates`, { system: {} });
    expect(e.status).toBe(201);
    // Alder is built 12 times, with two roof windows in each back slope; Birch 8 times, each with a hatch.
    expect(e.body.result.totals).toMatchObject({ roof_windows: 24, hatches: 8 });
    expect(e.body.result.totals.flashings.back_gutter_m).toBeCloseTo(8 * 1.2, 2);
    expect(e.body.result.ridges.find((r: { building: string }) => r.building === 'Alder')).toMatchObject({ ridge: 'Main', faces: ['Front', 'Back', 'East hip end', 'West hip end'] });
  });

  it('rejects an openings file naming a face not in the schedule or too big for its face, by row and column, storing nothing', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    await sendCsv(c, id, EXAMPLE_SCHEDULE_CSV);
    const details = expectInvalid(await sendOpenings(c, id, 'building,face,kind,width_mm,height_mm\nAlder,Side,chimney,600,900\nBirch,Porch,dormer,600,2500\n'));
    expect(details).toEqual([
      { row: 2, column: 'face', message: "no face 'Side' in building 'Alder' in the schedule" },
      { row: 3, column: 'height_mm', message: "2500 mm is taller than face 'Porch' (rafter 1800 mm)" },
    ]);
    expect(await stored(id)).toEqual({ versions: 1, faces: 7 });
  });

  it('saves typed openings and ridge names with the faces, checked by the same rules', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    const faces = [
      { building: 'A', face: 'Front', pitch_deg: 40, rafter_mm: 3000, eaves_mm: 6000, ridge: 'Main' },
      { building: 'A', face: 'Back', pitch_deg: 40, rafter_mm: 3000, eaves_mm: 6000, ridge: 'Main' },
    ];
    const res = await c.send('put', `/api/projects/${id}/schedule`, {
      faces,
      openings: [{ building: 'A', face: 'Back', kind: 'roof_window', width_mm: 780, height_mm: 1180 }],
    });
    expect(res.status).toBe(201);
    expect(res.body.faces.map((f: { ridge: string }) => f.ridge)).toEqual(['Main', 'Main']);
    expect(res.body.openings).toMatchObject([{ face: 'Back', kind: 'roof_window', quantity: 1 }]);
    const bad = await c.send('put', `/api/projects/${id}/schedule`, {
      faces: [...faces, { building: 'A', face: 'Hip', pitch_deg: 40, rafter_mm: 3000, eaves_mm: 6000, left: 'hip', right: 'hip' }],
      openings: [{ building: 'A', face: 'Back', kind: 'skylight', width_mm: 780, height_mm: 1180 }],
    });
    expect(expectInvalid(bad)).toEqual([
      { row: 3, column: 'top_mm', path: 'faces.2.top_mm', message: 'required on a face with a hip or valley edge' },
      { row: 1, column: 'kind', path: 'openings.0.kind', message: "unknown kind 'skylight': use roof_window, chimney, dormer or hatch" },
    ]);
    expect(await stored(id)).toEqual({ versions: 1, faces: 2 });
  });

  it('keeps opening a schedule stored before top_mm was required beside hips, and its estimate warns top_assumed', async () => {
    const { c } = await signedIn();
    const id = await siteOf(c);
    await sendCsv(c, id, EXAMPLE_SCHEDULE_CSV);
    // A face stored by an earlier version of the product: a hip edge, top taken as the eaves.
    const schedule = await t.db('schedules').where({ project_id: id }).first();
    await t.db('schedule_faces').where({ schedule_id: schedule.id, face: 'Front', building: 'Alder' }).update({ top_mm: 10200, top_assumed: true });
    const s = await c.get(`/api/projects/${id}/schedule`);
    expect(s.status).toBe(200);
    expect(s.body.faces[0]).toMatchObject({ top_mm: 10200, top_assumed: true });
    const e = await c.post(`/api/projects/${id}/estimates`, { system: {} });
    expect(e.status).toBe(201);
    expect(e.body.result.warnings.filter((w: { code: string }) => w.code === 'top_assumed').map((w: { face: string }) => w.face)).toEqual(['Front']);
  });

  it('downloads the example openings file without signing in', async () => {
    const res = await request(t.app).get('/api/examples/openings.csv');
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?openings\.csv"?$/);
    expect(res.text).toBe(EXAMPLE_OPENINGS_CSV);
  });
});

describe('the example schedule', () => {
  it('downloads without signing in, as the CSV the engine ships, and reads back as seven faces', async () => {
    const res = await request(t.app).get('/api/examples/roof-schedule.csv');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?roof-schedule\.csv"?$/);
    expect(res.text).toBe(EXAMPLE_SCHEDULE_CSV);
    const parsed = parseScheduleCsv(res.text);
    expect(parsed.ok && parsed.faces.length).toBe(7);
  });
});

describe('no role reaches another contractor’s schedules', () => {
  for (const role of ROLES) {
    it(`${role}: uploading to, replacing and reading another firm’s schedule is refused and stores nothing`, async () => {
      const owner = await signedIn('contractor', 'contractor_owner');
      const id = await siteOf(owner.c, `Victim ${role}`);
      await sendCsv(owner.c, id, EXAMPLE_SCHEDULE_CSV);
      const actor = await signedIn(kindOfRole(role), role);
      const attempts = [
        await sendCsv(actor.c, id, EXAMPLE_SCHEDULE_CSV),
        await sendFile(actor.c, id, EXAMPLE_SCHEDULE_CSV),
        await actor.c.send('put', `/api/projects/${id}/schedule`, { faces: [{ face: 'X', pitch_deg: 35, rafter_mm: 4000, eaves_mm: 5000 }] }),
        await actor.c.get(`/api/projects/${id}/schedule`),
        await actor.c.get(`/api/projects/${id}/schedules`),
        await actor.c.get(`/api/projects/${id}/schedules/1`),
      ];
      for (const res of attempts) expect([403, 404], `${role}: ${res.status}`).toContain(res.status);
      expect(await stored(id)).toEqual({ versions: 1, faces: 7 });
    });
  }
});
