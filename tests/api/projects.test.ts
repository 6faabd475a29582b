import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, kindOfRole } from '../../shared/domain/roles';
import { errorBodySchema } from '../../shared/schemas/error.schema';
import { projectListSchema, projectSchema } from '../../shared/schemas/project.schema';
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

const site = (over: Record<string, unknown> = {}) => ({
  name: 'Quarry Row',
  site_address: '2–8 Quarry Row, Fenwick Marsh',
  site_postcode: 'FM3 8QR',
  contact_name: 'Rhian Toller',
  contact_phone: '07700 900 112',
  vehicle_access: 'rigid_only',
  crane_lift: 'allowed',
  overhead_lines: 'present',
  set_down_place: 'Front drive of plot 2',
  access_notes: 'Narrow lane; no deliveries before 08:00.',
  buildings: [
    { name: 'Plot 2', kind: 'plot' },
    { name: 'Garage', kind: 'building', notes: 'Detached, mono-pitch' },
  ],
  ...over,
});

describe('creating a site', () => {
  it('stores the site address, contact, delivery access notes and buildings, and returns them', async () => {
    const { c } = await signedIn();
    const res = await c.post('/api/projects', site());
    expect(res.status).toBe(201);
    const p = projectSchema.parse(res.body);
    expect(p).toMatchObject({
      name: 'Quarry Row',
      site_postcode: 'FM3 8QR',
      contact_name: 'Rhian Toller',
      vehicle_access: 'rigid_only',
      crane_lift: 'allowed',
      overhead_lines: 'present',
      set_down_place: 'Front drive of plot 2',
      building_count: 2,
      schedule: null,
      estimate_count: 0,
      archived_at: null,
    });
    expect(p.buildings.map((b) => [b.name, b.kind, b.notes])).toEqual([
      ['Plot 2', 'plot', ''],
      ['Garage', 'building', 'Detached, mono-pitch'],
    ]);
    const again = await c.get(`/api/projects/${p.id}`);
    expect(again.status).toBe(200);
    expect(again.body).toEqual(res.body);
  });

  it('fills the access fields with "not yet checked" when only a name and address are given', async () => {
    const { c } = await signedIn();
    const res = await c.post('/api/projects', { name: 'Bare site', site_address: 'Lot 4, Wyke Fold' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ vehicle_access: 'any', crane_lift: 'unknown', overhead_lines: 'unknown', buildings: [] });
  });

  it('rejects a missing name, an unknown access word, a bad phone and a building named twice, naming each field', async () => {
    const { c } = await signedIn();
    const res = await c.post('/api/projects', site({ name: '  ', crane_lift: 'maybe', contact_phone: 'ring the office', buildings: [{ name: 'Plot 1' }, { name: 'plot 1' }] }));
    expect(res.status).toBe(422);
    const body = errorBodySchema.parse(res.body);
    expect(body.error.code).toBe('validation_failed');
    expect(body.error.details?.map((d) => d.path).sort()).toEqual(['buildings.1.name', 'contact_phone', 'crane_lift', 'name']);
    expect(await t.db('projects').where({ name: '  ' }).first()).toBeUndefined();
  });

  it('is refused to merchant roles', async () => {
    for (const role of ['merchant_owner', 'merchant_sales', 'merchant_dispatcher', 'driver'] as const) {
      const { c } = await signedIn('merchant', role);
      expect((await c.post('/api/projects', site())).status, role).toBe(403);
      expect((await c.get('/api/projects')).status, role).toBe(403);
    }
  });
});

describe('listing sites', () => {
  it('searches name, postcode and contact without case, sorts and pages, and hides archived sites unless asked', async () => {
    const { c } = await signedIn('contractor', 'contractor_owner');
    const ids: Record<string, number> = {};
    for (const [name, postcode, contact] of [
      ['Alder Close', 'AC1 1AA', 'Jo Penhale'],
      ['Birchfield 50% plots', 'BF2 2BB', 'Sam Ordway'],
      ['Cedar Garth', 'CG3 3CC', 'Ola Penhale'],
      ['Damson Yard', 'DY4 4DD', 'Kit Arnott'],
    ]) {
      const res = await c.post('/api/projects', site({ name, site_postcode: postcode, contact_name: contact, buildings: [] }));
      ids[name] = res.body.id;
    }
    await c.post(`/api/projects/${ids['Damson Yard']}/archive`);

    const all = projectListSchema.parse((await c.get('/api/projects?sort=name&dir=asc')).body);
    expect(all.projects.map((p) => p.name)).toEqual(['Alder Close', 'Birchfield 50% plots', 'Cedar Garth']);
    expect(all.total).toBe(3);

    const penhale = (await c.get('/api/projects?q=PENHALE&sort=name&dir=desc')).body;
    expect(penhale.projects.map((p: { name: string }) => p.name)).toEqual(['Cedar Garth', 'Alder Close']);

    // A % in the search is a character to find, not a wildcard.
    const percent = (await c.get('/api/projects?q=50%25')).body;
    expect(percent.projects.map((p: { name: string }) => p.name)).toEqual(['Birchfield 50% plots']);

    const byPostcode = (await c.get('/api/projects?q=cg3')).body;
    expect(byPostcode.projects.map((p: { name: string }) => p.name)).toEqual(['Cedar Garth']);

    const page2 = (await c.get('/api/projects?sort=name&dir=asc&page=2&page_size=2')).body;
    expect(page2).toMatchObject({ total: 3, page: 2, page_size: 2 });
    expect(page2.projects.map((p: { name: string }) => p.name)).toEqual(['Cedar Garth']);

    const archived = (await c.get('/api/projects?archived=true')).body;
    expect(archived.projects.map((p: { name: string }) => p.name)).toEqual(['Damson Yard']);
    expect((await c.get('/api/projects?archived=all')).body.total).toBe(4);
  });

  it('rejects an unknown sort column and a page size over 100', async () => {
    const { c } = await signedIn();
    const res = await c.get('/api/projects?sort=password&page_size=1000');
    expect(res.status).toBe(422);
    expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['page_size', 'sort']);
  });
});

describe('editing and archiving a site', () => {
  it('changes only the fields sent, replaces the building list when sent, and keeps the rest', async () => {
    const { c } = await signedIn();
    const { id } = (await c.post('/api/projects', site())).body;
    const res = await c.patch(`/api/projects/${id}`, { revision: 1, crane_lift: 'not_allowed', buildings: [{ name: 'Plot 2A', kind: 'plot' }] });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ crane_lift: 'not_allowed', name: 'Quarry Row', set_down_place: 'Front drive of plot 2', building_count: 1 });
    expect(res.body.buildings.map((b: { name: string }) => b.name)).toEqual(['Plot 2A']);
    expect(res.body.revision).toBe(2);
  });

  it('refuses an edit without a revision (422) and one made on a stale revision (409), keeping the other person’s save', async () => {
    const { c } = await signedIn();
    const { id } = (await c.post('/api/projects', site())).body;
    const missing = await c.patch(`/api/projects/${id}`, { name: 'No revision' });
    expect(missing.status).toBe(422);
    expect(missing.body.error.details[0].path).toBe('revision');
    expect((await c.patch(`/api/projects/${id}`, { revision: 1, contact_name: 'First saver' })).status).toBe(200);
    const stale = await c.patch(`/api/projects/${id}`, { revision: 1, contact_name: 'Second saver' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('project_changed');
    const now = (await c.get(`/api/projects/${id}`)).body;
    expect(now).toMatchObject({ contact_name: 'First saver', revision: 2 });
  });

  it('rejects an empty change and a bad value with 422 and changes nothing', async () => {
    const { c } = await signedIn();
    const { id } = (await c.post('/api/projects', site())).body;
    expect((await c.patch(`/api/projects/${id}`, { revision: 1 })).status).toBe(422);
    const bad = await c.patch(`/api/projects/${id}`, { revision: 1, vehicle_access: 'helicopter' });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details[0].path).toBe('vehicle_access');
    expect((await c.get(`/api/projects/${id}`)).body.vehicle_access).toBe('rigid_only');
  });

  it('archives a site (no edits until restored) and restores it', async () => {
    const { c } = await signedIn();
    const { id } = (await c.post('/api/projects', site())).body;
    const archived = await c.post(`/api/projects/${id}/archive`);
    expect(archived.status).toBe(200);
    expect(archived.body.archived_at).toEqual(expect.any(String));
    const edit = await c.patch(`/api/projects/${id}`, { revision: 1, name: 'Renamed' });
    expect(edit.status).toBe(409);
    expect(edit.body.error.code).toBe('project_archived');
    const restored = await c.post(`/api/projects/${id}/restore`);
    expect(restored.body.archived_at).toBeNull();
    expect((await c.patch(`/api/projects/${id}`, { revision: 1, name: 'Renamed' })).body.name).toBe('Renamed');
  });
});

describe('no role reaches another contractor’s sites', () => {
  for (const role of ROLES) {
    it(`${role}: reading, editing, archiving and restoring another firm’s site is refused and changes nothing`, async () => {
      const owner = await signedIn('contractor', 'contractor_owner');
      const { id } = (await owner.c.post('/api/projects', site({ name: `Victim site ${role}` }))).body;
      const before = await t.db('projects').where({ id }).first();

      const actor = await signedIn(kindOfRole(role), role);
      const attempts = [
        await actor.c.get(`/api/projects/${id}`),
        await actor.c.patch(`/api/projects/${id}`, { revision: 1, name: 'Taken over' }),
        await actor.c.post(`/api/projects/${id}/archive`),
        await actor.c.post(`/api/projects/${id}/restore`),
      ];
      for (const res of attempts) expect([403, 404], `${role}: ${res.status}`).toContain(res.status);
      expect(await t.db('projects').where({ id }).first()).toEqual(before);

      const list = await actor.c.get('/api/projects?archived=all');
      if (list.status === 200) expect(list.body.projects.map((p: { id: number }) => p.id)).not.toContain(id);
      else expect(list.status).toBe(403);
    });
  }
});
