import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { EXAMPLE_OPENINGS_CSV } from '../../../../shared/engine/example-openings';
import { EXAMPLE_SCHEDULE_CSV } from '../../../../shared/engine/example-schedule';
import { parseOpeningsCsv } from '../../../../shared/engine/openings-parse';
import { parseScheduleCsv } from '../../../../shared/engine/schedule-parse';
import { engineFace } from '../../../../shared/domain/stored-schedule';
import type { StoredFace, StoredOpening } from '../../../../shared/schemas/schedule-upload.schema';
import { renderWithProviders } from '../../../test-utils/render-with-providers';
import { scheduleFixture } from '../../../test-utils/schedule-fixture';
import { CurrentSchedule } from './current-schedule';

const parsed = parseScheduleCsv(EXAMPLE_SCHEDULE_CSV);
if (!parsed.ok) throw new Error('the example schedule no longer reads');
/** The example schedule as stored on site 4, version 3. */
const faces: StoredFace[] = parsed.faces.map((f, i) => ({ ...f, id: i + 1, position: i + 1, ridge: f.ridge ?? null, top_assumed: false }));
const firstOpenings: StoredOpening[] = [{ id: 1, position: 1, building: 'Birch', face: 'Porch', kind: 'hatch', width_mm: 600, height_mm: 900, quantity: 1 }];

const version = (n: number, openings: StoredOpening[]) => scheduleFixture(faces, openings, { id: 10 + n, version: n, source: 'csv', filename: 'roof-schedule.csv' });

/** The first test of a file waits for a part loaded after the page (the engine, the import), slow on a busy machine. */
const LAZY_PARTS = { timeout: 20_000 };

const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

/**
 * The API as far as these screens use it, reading an openings file with the engine's own reader against
 * the stored faces and answering as the server does: the next version, or every problem by row and column.
 */
function fakeApi() {
  let current = version(3, firstOpenings);
  const posts: string[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = String(input).replace(/^https?:\/\/[^/]+/, '');
    const method = (init?.method ?? 'GET').toUpperCase();
    if (method === 'GET' && url === '/api/projects/4/schedule?optional=1') return json(200, current);
    if (method === 'GET' && url === '/api/projects/4/schedules') return json(200, { versions: [] });
    if (method === 'GET' && url === '/api/auth/csrf') return json(200, { token: 'csrf' });
    if (method === 'POST' && url === '/api/projects/4/schedule/openings') {
      const text = await ((init!.body as FormData).get('file') as File).text();
      posts.push(text);
      const read = parseOpeningsCsv(text, faces.map(engineFace));
      if (!read.ok) {
        const details = read.errors.map((p) => ({ ...(p.row !== undefined ? { row: p.row } : {}), ...(p.column !== undefined ? { column: p.column } : {}), message: p.message }));
        return json(422, { error: { code: 'invalid_schedule', message: `The schedule was not stored: ${details.length} problems to fix`, details } });
      }
      current = version(
        current.version + 1,
        read.openings.map((o, i) => ({ ...o, id: 100 + i, position: i + 1 })),
      );
      return json(201, current);
    }
    throw new Error(`No answer for ${method} ${url}`);
  });
  vi.stubGlobal('fetch', fetchMock);
  return { fetchMock, posts, current: () => current };
}

async function renderSchedule() {
  renderWithProviders(<CurrentSchedule projectId={4} readOnly={false} />);
  // The import's code loads after the schedule shows.
  return (await screen.findByLabelText('Import openings (CSV)', {}, { timeout: 5000 })) as HTMLInputElement;
}

function choose(input: HTMLInputElement, text: string, name = 'openings.csv') {
  fireEvent.change(input, { target: { files: [new File([text], name, { type: 'text/csv' })] } });
}

/** The openings table's rows as text: building, face, kind, width, height, quantity. */
function openingRows(): string[][] {
  const table = screen.getByRole('table', { name: 'Openings' });
  return within(table)
    .getAllByRole('row')
    .slice(1)
    .map((row) =>
      within(row)
        .getAllByRole('cell')
        .map((cell) => cell.textContent ?? ''),
    );
}

describe('OpeningsImport', LAZY_PARTS, () => {
  it('stores a good file as the next version and the openings table shows its rows in place of the old ones', async () => {
    const api = fakeApi();
    const input = await renderSchedule();
    expect(openingRows()).toEqual([['Birch', 'Porch', 'Hatch', '600', '900', '1']]);
    choose(input, EXAMPLE_OPENINGS_CSV);

    const success = await screen.findByText('Version 4 stored');
    expect(success.closest('[role="status"], [role="alert"], div')?.textContent).toMatch(/3 openings in 7 faces/);
    await waitFor(() =>
      expect(openingRows()).toEqual([
        ['Alder', 'Back', 'Roof window', '780', '1,180', '2'],
        ['Birch', 'Front', 'Chimney', '900', '700', '1'],
        ['Birch', 'Back', 'Hatch', '600', '900', '1'],
      ]),
    );
    expect(screen.getByRole('heading', { name: 'Openings (3)' })).toBeTruthy();
    expect(screen.getByText(/^Version 4 · 7 faces/)).toBeTruthy();
    expect(api.posts).toEqual([EXAMPLE_OPENINGS_CSV]);
  });

  it('lists every problem of a bad file by row and column, and the schedule and its openings stay as they were', async () => {
    const api = fakeApi();
    const input = await renderSchedule();
    const bad = [
      'building,face,kind,width_mm,height_mm,quantity',
      'Alder,Back,roof_window,0.78,1180,2', // metres in a millimetre column
      'Birch,Front,skylight,900,700,1', // not a kind of opening
      'Birch,Side,hatch,600,900,1', // no such face
      '',
    ].join('\r\n');
    choose(input, bad);

    const alert = (await screen.findByText('The openings were not stored')).closest('[role="alert"]') as HTMLElement;
    const problems = within(alert)
      .getAllByRole('listitem')
      .map((li) => li.textContent);
    expect(problems).toEqual([
      'Row 2, column width_mm: looks like metres (0.78); give millimetres, e.g. 780',
      "Row 3, column kind: unknown kind 'skylight': use roof_window, chimney, dormer or hatch",
      "Row 4, column face: no face 'Side' in building 'Birch' in the schedule",
    ]);
    // Nothing changed: the same version, the same one opening.
    expect(api.current().version).toBe(3);
    expect(openingRows()).toEqual([['Birch', 'Porch', 'Hatch', '600', '900', '1']]);
    expect(screen.getByText(/^Version 3 · 7 faces/)).toBeTruthy();
    expect(screen.queryByText(/^Version \d+ stored$/)).toBeNull();
  });

  it('refuses an empty file before sending it', async () => {
    const api = fakeApi();
    const input = await renderSchedule();
    choose(input, '');
    const alert = (await screen.findByText('This file cannot be read')).closest('[role="alert"]') as HTMLElement;
    expect(alert.textContent).toMatch(/openings\.csv is empty\./);
    expect(api.posts).toEqual([]);
    expect(openingRows()).toEqual([['Birch', 'Porch', 'Hatch', '600', '900', '1']]);
  });
});
