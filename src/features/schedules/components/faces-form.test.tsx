import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { SCHEDULE_MESSAGES } from '../../../../shared/schemas/schedule.schema';
import type { StoredFace, StoredOpening } from '../../../../shared/schemas/schedule-upload.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { scheduleFixture } from '../../../test-utils/schedule-fixture';
import { FacesForm } from './faces-form';

/** Invented faces of one house type: a hipped front stored before a top was required, and a gabled back. */
const storedFaces: StoredFace[] = [
  {
    id: 1,
    position: 1,
    building: 'Alder',
    face: 'Front',
    quantity: 2,
    pitch_deg: 35,
    rafter_mm: 4000,
    run_mm: 3276.6,
    eaves_mm: 9000,
    // The migration took the top as the eaves.
    top_mm: 9000,
    left: 'hip',
    right: 'hip',
    top: 'ridge',
    ridge: null,
    top_assumed: true,
  },
  {
    id: 2,
    position: 2,
    building: 'Alder',
    face: 'Back',
    quantity: 2,
    pitch_deg: 35,
    rafter_mm: 4000,
    run_mm: 3276.6,
    eaves_mm: 6000,
    top_mm: 6000,
    left: 'verge',
    right: 'verge',
    top: 'ridge',
    ridge: null,
    top_assumed: false,
  },
];

const stored = (faces: StoredFace[], openings: StoredOpening[] = []) => scheduleFixture(faces, openings);

const face = (name: string) => screen.getByRole('group', { name: new RegExp(`^Face \\d+: ${name}$`) });
const input = (group: HTMLElement, label: string) => within(group).getByLabelText(label) as HTMLInputElement;
/** An opening's quantity (the face has a quantity of its own, first). */
const openingQuantity = (group: HTMLElement) => within(group).getAllByLabelText('Quantity')[1] as HTMLInputElement;
/** The text of the field's error, read through its aria-describedby, or null when it is not marked. */
const errorOf = (field: HTMLElement) => {
  if (field.getAttribute('aria-invalid') !== 'true') return null;
  const ids = field.getAttribute('aria-describedby')!.split(' ');
  return document.getElementById(ids.find((id) => id.endsWith('-error'))!)?.textContent ?? null;
};
const save = () => fireEvent.click(screen.getByRole('button', { name: 'Save as a new version' }));
const putBody = (fetchMock: ReturnType<typeof stubFetch>) => {
  const put = fetchMock.mock.calls.find((call) => (call[1] as RequestInit | undefined)?.method === 'PUT');
  return put ? (JSON.parse((put[1] as RequestInit).body as string) as { faces: Record<string, unknown>[]; openings: Record<string, unknown>[] }) : null;
};

describe('FacesForm: a face whose top was assumed', () => {
  it('leaves the top edge blank with a hint, and the schema asks for it before anything is stored', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<FacesForm projectId={4} initial={storedFaces} onSaved={vi.fn()} />);

    const top = input(face('Front'), 'Top edge (mm)');
    expect(top.value).toBe('');
    const hintId = top.getAttribute('aria-describedby')!;
    expect(document.getElementById(hintId)?.textContent).toMatch(/^Needed: this face was stored without its top edge, which was taken as the eaves/);
    // A face whose top was given keeps it (between two verges it is the eaves anyway, left blank).
    expect(input(face('Back'), 'Eaves (mm)').value).toBe('6000');

    save();
    await waitFor(() => expect(errorOf(top)).toBe(SCHEDULE_MESSAGES.topRequired));
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('stores the top edge typed in, and the hint goes once there is one', async () => {
    const onSaved = vi.fn();
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'PUT /api/projects/4/schedule': { status: 201, body: stored(storedFaces.map((f) => ({ ...f, top_assumed: false, top_mm: f.face === 'Front' ? 2450 : f.top_mm }))) },
    });
    renderWithProviders(<FacesForm projectId={4} initial={storedFaces} onSaved={onSaved} />);

    const top = input(face('Front'), 'Top edge (mm)');
    fireEvent.change(top, { target: { value: '2450' } });
    expect(top.getAttribute('aria-describedby')).toBeNull();
    save();
    await waitFor(() => expect(onSaved).toHaveBeenCalledOnce());
    const body = putBody(fetchMock)!;
    expect(body.faces.map((f) => [f.face, f.top_mm])).toEqual([
      ['Front', 2450],
      ['Back', undefined],
    ]);
  });
});

describe('FacesForm: the openings of a face', () => {
  it('sends an opening typed under a face with that face’s building and name', async () => {
    const onSaved = vi.fn();
    const faces = storedFaces.map((f) => ({ ...f, top_mm: f.face === 'Front' ? 2450 : f.top_mm, top_assumed: false }));
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'PUT /api/projects/4/schedule': { status: 201, body: stored(faces, [{ id: 1, position: 1, building: 'Alder', face: 'Back', kind: 'chimney', width_mm: 900, height_mm: 700, quantity: 1 }]) },
    });
    renderWithProviders(<FacesForm projectId={4} initial={faces} onSaved={onSaved} />);

    fireEvent.click(screen.getByRole('button', { name: 'Add an opening to face 2 (Back)' }));
    const back = face('Back');
    expect(within(back).getByText(/^Openings in this face \(1\)/)).toBeTruthy();
    fireEvent.change(input(back, 'Kind'), { target: { value: 'chimney' } });
    fireEvent.change(input(back, 'Width (mm)'), { target: { value: '900' } });
    fireEvent.change(input(back, 'Height (mm)'), { target: { value: '700' } });
    // The front has no opening row of its own.
    expect(within(face('Front')).queryByLabelText('Width (mm)')).toBeNull();
    save();

    await waitFor(() => expect(onSaved).toHaveBeenCalledOnce());
    expect(putBody(fetchMock)!.openings).toEqual([{ building: 'Alder', face: 'Back', kind: 'chimney', width_mm: 900, height_mm: 700, quantity: 1 }]);
  });

  it('marks the cell of the column that is wrong, under the face it belongs to, and sends nothing', async () => {
    const faces = storedFaces.map((f) => ({ ...f, top_mm: f.face === 'Front' ? 2450 : f.top_mm, top_assumed: false }));
    const fetchMock = stubFetch({});
    renderWithProviders(<FacesForm projectId={4} initial={faces} onSaved={vi.fn()} />);

    fireEvent.click(screen.getByRole('button', { name: 'Add an opening to face 1 (Front)' }));
    fireEvent.click(screen.getByRole('button', { name: 'Add an opening to face 2 (Back)' }));
    const front = face('Front');
    const back = face('Back');
    fireEvent.change(input(front, 'Width (mm)'), { target: { value: '780' } });
    fireEvent.change(input(front, 'Height (mm)'), { target: { value: '1180' } });
    // Metres typed into a millimetre column, and a height left out.
    fireEvent.change(input(back, 'Width (mm)'), { target: { value: '0.9' } });
    fireEvent.change(openingQuantity(back), { target: { value: '0' } });
    save();

    await waitFor(() => expect(errorOf(input(back, 'Width (mm)'))).toBe('looks like metres (0.9); give millimetres, e.g. 900'));
    expect(errorOf(input(back, 'Height (mm)'))).toBe(SCHEDULE_MESSAGES.notNumber);
    expect(errorOf(openingQuantity(back))).not.toBeNull();
    expect(errorOf(input(back, 'Kind'))).toBeNull();
    // The front's opening is right, and so is every face cell.
    for (const label of ['Kind', 'Width (mm)', 'Height (mm)']) expect(errorOf(input(front, label))).toBeNull();
    expect(errorOf(openingQuantity(front))).toBeNull();
    expect(screen.queryByRole('alert')).toBeNull();
    expect(fetchMock).not.toHaveBeenCalled();

    // Typing in a marked cell clears its mark.
    fireEvent.change(input(back, 'Width (mm)'), { target: { value: '900' } });
    expect(errorOf(input(back, 'Width (mm)'))).toBeNull();
  });

  it('puts the server’s refusal of an opening on its cell (an opening taller than its face)', async () => {
    const faces = storedFaces.map((f) => ({ ...f, top_mm: f.face === 'Front' ? 2450 : f.top_mm, top_assumed: false }));
    stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'PUT /api/projects/4/schedule': {
        status: 422,
        body: {
          error: {
            code: 'invalid_schedule',
            message: 'The schedule was not stored: 1 problem to fix',
            details: [{ row: 1, column: 'height_mm', path: 'openings.0.height_mm', message: "4200 mm is taller than face 'Back' (rafter 4000 mm)" }],
          },
        },
      },
    });
    renderWithProviders(<FacesForm projectId={4} initial={faces} onSaved={vi.fn()} />);
    fireEvent.click(screen.getByRole('button', { name: 'Add an opening to face 2 (Back)' }));
    const back = face('Back');
    fireEvent.change(input(back, 'Width (mm)'), { target: { value: '780' } });
    fireEvent.change(input(back, 'Height (mm)'), { target: { value: '4200' } });
    save();

    await waitFor(() => expect(errorOf(input(back, 'Height (mm)'))).toBe("4200 mm is taller than face 'Back' (rafter 4000 mm)"));
    expect(errorOf(input(back, 'Width (mm)'))).toBeNull();
  });
});
