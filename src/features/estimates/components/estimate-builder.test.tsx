import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { estimate } from '../../../../shared/engine/estimate';
import { parseRoofSystem } from '../../../../shared/engine/roof-system';
import { scheduleSchema } from '../../../../shared/schemas/schedule.schema';
import type { Face } from '../../../../shared/schemas/schedule.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { EstimateBuilder } from './estimate-builder';

const PITCH = 35;
const RAFTER = 3000;
const RUN = RAFTER * Math.cos((PITCH * Math.PI) / 180);

/** An invented gabled house: two slopes between verges meeting at one ridge. */
const gable: Face[] = scheduleSchema.parse([
  { building: 'Larch', face: 'Front', pitch_deg: PITCH, rafter_mm: RAFTER, eaves_mm: 6000, left: 'verge', right: 'verge', top: 'ridge', ridge: 'Main' },
  { building: 'Larch', face: 'Back', pitch_deg: PITCH, rafter_mm: RAFTER, eaves_mm: 6000, left: 'verge', right: 'verge', top: 'ridge', ridge: 'Main' },
]);

/**
 * An invented wing meeting a main roof at one valley, both at the same pitch: on plan the valley runs at
 * 45°, so each face widens by its run towards the top (top = eaves + run).
 */
const valleyPair: Face[] = scheduleSchema.parse([
  { building: 'Yew', face: 'Wing west', pitch_deg: PITCH, rafter_mm: RAFTER, eaves_mm: 4000, top_mm: 4000 + RUN, left: 'verge', right: 'valley', top: 'ridge', ridge: 'Wing' },
  { building: 'Yew', face: 'Main north', pitch_deg: PITCH, rafter_mm: RAFTER, eaves_mm: 4000, top_mm: 4000 + RUN, left: 'valley', right: 'verge', top: 'ridge', ridge: 'Main' },
]);

function renderBuilder(faces: Face[], fetchRoutes: Parameters<typeof stubFetch>[0] = {}) {
  const fetchMock = stubFetch({ 'GET /api/systems': { status: 200, body: { systems: [] } }, ...fetchRoutes });
  const onCreated = vi.fn();
  renderWithProviders(<EstimateBuilder projectId={4} faces={faces} scheduleVersion={3} onCreated={onCreated} />);
  fireEvent.click(screen.getByRole('radio', { name: /A generic system/ }));
  return { fetchMock, onCreated };
}

/** The preview works again after each change (deferred, the whole engine): give a busy machine time. */
const SLOW = { timeout: 5000 };
/** The first test of a file waits for a part loaded after the page (the engine, the import), slow on a busy machine. */
const LAZY_PARTS = { timeout: 20_000 };

const choose = (label: string, value: string) => fireEvent.change(screen.getByLabelText(label), { target: { value } });
const type = (label: string, value: string) => fireEvent.change(screen.getByLabelText(label), { target: { value } });

/** The preview's figure for a fitting, once the engine (loaded after the form) has worked it out. */
async function fitting(label: string): Promise<string | null> {
  const preview = await screen.findByTestId('estimate-preview', {}, { timeout: 10_000 });
  const region = preview.parentElement!;
  const extras = within(region).queryByRole('region', { name: 'Special pieces and fittings' });
  if (!extras) return null;
  const row = within(extras).queryByRole('rowheader', { name: label })?.closest('tr');
  return row ? within(row).getAllByRole('cell')[0].textContent : null;
}

const errorOf = (label: string) => {
  const input = screen.getByLabelText(label);
  if (input.getAttribute('aria-invalid') !== 'true') return null;
  const ids = input.getAttribute('aria-describedby')!.split(' ');
  return document.getElementById(ids.find((id) => id.endsWith('-error'))!)?.textContent ?? null;
};

const postedBody = (fetchMock: ReturnType<typeof stubFetch>) => {
  const post = fetchMock.mock.calls.find((call) => (call[1] as RequestInit | undefined)?.method === 'POST');
  return post ? (JSON.parse((post[1] as RequestInit).body as string) as { system: Record<string, Record<string, unknown>> }) : null;
};

describe('EstimateBuilder: a generic system’s verges', LAZY_PARTS, () => {
  it('counts dry verge units and ridge end caps once dry verges are chosen, and none with mortar', async () => {
    renderBuilder(gable);
    expect((screen.getByLabelText('Verges') as HTMLSelectElement).value).toBe('mortar');
    expect(await fitting('Verges')).toBe('12 m');
    expect(await fitting('Dry verge units')).toBeNull();

    choose('Verges', 'dry');
    // Common practice: one dry verge unit per course at each verge, and a cap at each end of a ridge that
    // finishes at a verge. The courses are the engine's own (they do not depend on the verge).
    const courses = estimate([...gable], (parseRoofSystem({}) as { ok: true; system: never }).system).faces.map((f) => f.courses);
    const units = courses.reduce((sum, c) => sum + 2 * c, 0);
    expect(units).toBeGreaterThan(0);
    await waitFor(() => expect(fitting('Dry verge units')).resolves.toBe(String(units)), SLOW);
    expect(await fitting('Ridge end caps')).toBe('2');
  });

  it('sends the verge kind chosen with the system', async () => {
    const { fetchMock } = renderBuilder(gable, {
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'POST /api/projects/4/estimates': { status: 500, body: { error: { code: 'internal', message: 'Something went wrong' } } },
    });
    choose('Verges', 'dry');
    fireEvent.click(screen.getByRole('button', { name: 'Save the estimate' }));
    await waitFor(() => expect(postedBody(fetchMock)).not.toBeNull());
    expect(postedBody(fetchMock)!.system.verge).toEqual({ kind: 'dry' });
  });
});

describe('EstimateBuilder: a generic system’s valleys', LAZY_PARTS, () => {
  it('shows the trough unit length and lap only for trough valleys, and counts the units from them', async () => {
    renderBuilder(valleyPair);
    expect(screen.queryByLabelText('Trough unit length (mm)')).toBeNull();
    expect(await fitting('Valley trough units')).toBeNull();

    choose('Valleys', 'trough');
    expect((screen.getByLabelText('Trough unit length (mm)') as HTMLInputElement).value).toBe('3000');
    expect((screen.getByLabelText('Lap between units (mm)') as HTMLInputElement).value).toBe('150');
    // Geometry: an equal-pitch valley is √(rafter² + run²) long on the slope, here about 3,878 mm; units
    // lapping 150 mm cover 2,850 mm each, so ⌈3878 / 2850⌉ = 2 units (common practice: each unit laps the one below).
    const valley = Math.hypot(RAFTER, RUN);
    expect(Math.round(valley)).toBe(3878);
    await waitFor(() => expect(fitting('Valley trough units')).resolves.toBe(String(Math.ceil(valley / (3000 - 150)))), SLOW);

    // Shorter units: ⌈3878 / (1500 − 100)⌉ = 3.
    type('Trough unit length (mm)', '1500');
    type('Lap between units (mm)', '100');
    await waitFor(() => expect(fitting('Valley trough units')).resolves.toBe('3'), SLOW);

    choose('Valleys', 'lined');
    expect(screen.queryByLabelText('Trough unit length (mm)')).toBeNull();
    await waitFor(() => expect(fitting('Valley trough units')).resolves.toBeNull(), SLOW);
  });

  it('refuses a lap as long as the unit on the lap’s own field, and sends nothing', async () => {
    const { fetchMock } = renderBuilder(valleyPair);
    choose('Valleys', 'trough');
    type('Trough unit length (mm)', '1200');
    type('Lap between units (mm)', '1200');
    fireEvent.click(screen.getByRole('button', { name: 'Save the estimate' }));
    await waitFor(() => expect(errorOf('Lap between units (mm)')).toBe('lap_mm must be less than unit_length_mm'));
    expect(errorOf('Trough unit length (mm)')).toBeNull();
    type('Trough unit length (mm)', 'three metres');
    fireEvent.click(screen.getByRole('button', { name: 'Save the estimate' }));
    await waitFor(() => expect(errorOf('Trough unit length (mm)')).toBe('must be a number'));
    expect(fetchMock.mock.calls.some((call) => (call[1] as RequestInit | undefined)?.method === 'POST')).toBe(false);
  });

  it('sends the trough’s length and lap with the valley kind', async () => {
    const { fetchMock } = renderBuilder(valleyPair, {
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'POST /api/projects/4/estimates': { status: 500, body: { error: { code: 'internal', message: 'Something went wrong' } } },
    });
    choose('Valleys', 'trough');
    type('Trough unit length (mm)', '2400');
    fireEvent.click(screen.getByRole('button', { name: 'Save the estimate' }));
    await waitFor(() => expect(postedBody(fetchMock)).not.toBeNull());
    expect(postedBody(fetchMock)!.system.valley).toEqual({ kind: 'trough', unit_length_mm: 2400, lap_mm: 150 });
  });
});

describe('EstimateBuilder: a double-lap tile’s special pieces', LAZY_PARTS, () => {
  it('shows the three weights only for a double-lap tile, blank, with the weights the engine uses when left blank', async () => {
    renderBuilder(gable);
    expect(screen.queryByLabelText('Eaves tile (kg)')).toBeNull();
    choose('Kind of tile', 'double_lap');
    type('Weight of one tile (kg)', '1.2');
    const eaves = screen.getByLabelText('Eaves tile (kg)') as HTMLInputElement;
    expect(eaves.value).toBe('');
    const hint = (label: string) => document.getElementById(screen.getByLabelText(label).getAttribute('aria-describedby')!)?.textContent;
    // The roof-system schema's own rule: eaves and top tiles as a full tile, a tile-and-a-half as 1.5 tiles.
    await waitFor(() => expect(hint('Eaves tile (kg)')).toBe('Blank: as a full tile (1.2 kg)'));
    expect(hint('Top tile (kg)')).toBe('Blank: as a full tile (1.2 kg)');
    expect(hint('Tile-and-a-half (kg)')).toBe('Blank: one and a half full tiles (1.8 kg)');
    const system = parseRoofSystem({ tile: { kind: 'double_lap', length_mm: 265, width_mm: 165, headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }], weight_kg: 1.2, per_pallet: 1000 } });
    expect(system.ok && [system.system.tile.eaves_tile_kg, system.system.tile.top_tile_kg, system.system.tile.tile_and_half_kg]).toEqual([1.2, 1.2, 1.2 * 1.5]);

    choose('Kind of tile', 'single_lap');
    expect(screen.queryByLabelText('Eaves tile (kg)')).toBeNull();
  });

  it('refuses a weight that is not a number or not above 0 on its own field', async () => {
    const { fetchMock } = renderBuilder(gable);
    choose('Kind of tile', 'double_lap');
    type('Eaves tile (kg)', 'heavy');
    type('Tile-and-a-half (kg)', '0');
    fireEvent.click(screen.getByRole('button', { name: 'Save the estimate' }));
    await waitFor(() => expect(errorOf('Eaves tile (kg)')).toBe('must be a number'));
    expect(errorOf('Tile-and-a-half (kg)')).toBe('must be more than 0');
    expect(errorOf('Top tile (kg)')).toBeNull();
    type('Eaves tile (kg)', '1.0');
    fireEvent.click(screen.getByRole('button', { name: 'Save the estimate' }));
    await waitFor(() => expect(errorOf('Eaves tile (kg)')).toBeNull());
    expect(errorOf('Tile-and-a-half (kg)')).toBe('must be more than 0');
    expect(fetchMock.mock.calls.some((call) => (call[1] as RequestInit | undefined)?.method === 'POST')).toBe(false);
  });

  it('sends the weights given and leaves out those left blank; a refusal from the server lands on its field', async () => {
    const { fetchMock } = renderBuilder(gable, {
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'POST /api/projects/4/estimates': {
        status: 422,
        body: { error: { code: 'invalid_system', message: 'The roof system is not complete or not valid', details: [{ path: 'system.tile.top_tile_kg', message: 'must be at most the weight of a full tile' }] } },
      },
    });
    choose('Kind of tile', 'double_lap');
    type('Eaves tile (kg)', '1.0');
    type('Top tile (kg)', '0.9');
    fireEvent.click(screen.getByRole('button', { name: 'Save the estimate' }));
    await waitFor(() => expect(errorOf('Top tile (kg)')).toBe('must be at most the weight of a full tile'));
    const tile = postedBody(fetchMock)!.system.tile;
    expect(tile.kind).toBe('double_lap');
    expect([tile.eaves_tile_kg, tile.top_tile_kg, 'tile_and_half_kg' in tile]).toEqual([1.0, 0.9, false]);
  });
});
