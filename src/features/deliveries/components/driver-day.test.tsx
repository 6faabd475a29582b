import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import type { RoofSystem } from '../../../../shared/schemas/roof-system.schema';
import type { LandingFaceDrawing } from '../../../../shared/schemas/run.schema';
import { driverDay, driverDrop, RUN_CAUTIONS } from '../../../test-utils/driver-day-fixture';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { OutboxProvider } from '../lib/phone-outbox';
import { createTestOutbox } from '../lib/test-outbox';
import { DriverDay } from './driver-day';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

function renderDay(
  day = driverDay(),
  renderFaceDrawing = vi.fn((drawing: LandingFaceDrawing, system: RoofSystem) => <p>{`stacks of ${drawing.result.building} ${drawing.result.face}, ${drawing.result.stacks} of ${system.roof_loading.stack_size}`}</p>),
) {
  const outbox = createTestOutbox();
  const view = renderWithProviders(
    <OutboxProvider outbox={outbox}>
      <DriverDay day={day} renderFaceDrawing={renderFaceDrawing} />
    </OutboxProvider>,
  );
  return { ...view, outbox, renderFaceDrawing };
}

describe('DriverDay', () => {
  it('shows the cautions once per run, not once per drop, and records the acknowledgement with a key made on the phone', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'POST /api/runs/40/cautions-read': { status: 200, body: { run_id: 40, read_at: '2027-03-01T07:02:00.000Z', read_by: { id: 8, name: 'Kofi Brennagh' } } },
    });
    renderDay();
    // Two runs, three drops: each caution appears once for each run.
    expect(screen.getAllByText(RUN_CAUTIONS[0])).toHaveLength(2);
    const morning = screen.getByRole('region', { name: 'Run 07:30-12:00 on RL-TY01' });
    fireEvent.click(within(morning).getByRole('button', { name: 'I have read these' }));
    await waitFor(() => expect(within(morning).queryByRole('button', { name: 'I have read these' })).toBeNull());
    const call = fetchMock.mock.calls.find(([url]) => String(url) === '/api/runs/40/cautions-read');
    expect(call?.[1]?.method).toBe('POST');
    expect((call?.[1]?.headers as Record<string, string>)['Idempotency-Key']).toMatch(UUID);
    expect(within(morning).getByText(/^Cautions read/)).toBeTruthy();
    // The afternoon run still asks.
    expect(within(screen.getByRole('region', { name: 'Run 12:30-16:30 on RL-TY01' })).getByRole('button', { name: 'I have read these' })).toBeTruthy();
  });

  it('opens one drop at a time, the first not yet delivered, and folds the delivered ones to a line', () => {
    renderDay();
    const headers = screen.getAllByRole('button', { expanded: true });
    expect(headers).toHaveLength(1);
    expect(headers[0].textContent).toContain('Hollin Brow');
    const delivered = screen.getByRole('button', { name: /Larchgate Farm/ });
    expect(delivered.getAttribute('aria-expanded')).toBe('false');
    expect(delivered.textContent).toContain('Delivered');
    // Opening the second drop closes the first.
    fireEvent.click(screen.getByRole('button', { name: /Quarry Rise/ }));
    expect(screen.getAllByRole('button', { expanded: true }).map((b) => b.textContent)).toEqual([expect.stringContaining('Quarry Rise')]);
    expect(screen.getAllByTestId('pallet')).toHaveLength(3);
  });

  it("links the site address to the phone's maps app and lists access and set-down notes", () => {
    renderDay();
    const link = screen.getByRole('link', { name: 'Open in maps' });
    expect(link.getAttribute('href')).toBe('https://maps.example.test/?q=4%20Hollin%20Brow%2C%20Tollerbeck%20TB4%207QX');
    expect(screen.getByText('4 Hollin Brow, Tollerbeck, TB4 7QX')).toBeTruthy();
    expect(screen.getByText('Gate code 4512; reverse in from Mill Lane.')).toBeTruthy();
    expect(screen.getByText('Set down: Hardstanding by the cabin')).toBeTruthy();
    expect(screen.getByRole('link', { name: /Call Gethin Marlow/ }).getAttribute('href')).toBe('tel:07700900001');
  });

  it('names accessories with their product names and units, never the raw words', () => {
    renderDay();
    const products = screen.getByRole('list', { name: 'Products on pallet 3' });
    expect(within(products).getByText('Dry ridge tile, slate grey: 24 pieces')).toBeTruthy();
    expect(within(products).getByText('Tile clips: 200 pieces')).toBeTruthy();
    // No line starts with an engine key such as "clips" or "ridge_tiles".
    expect(
      within(products)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).not.toContainEqual(expect.stringMatching(/^[a-z_]+:/));
    const pallets = screen.getAllByTestId('pallet');
    expect(pallets.map((p) => p.querySelector('p')?.textContent)).toEqual(['Pallet 1 of 3 · 1,080 kg', 'Pallet 2 of 3 · 1,070 kg', 'Pallet 3 of 3 · 96 kg']);
    expect(within(pallets[1]).getByText('spare (waste allowance)')).toBeTruthy();
  });

  it('marks a short face with how many tiles are missing and when the rest is due', () => {
    renderDay();
    const short = screen.getByTestId('short-face');
    expect(short.textContent).toBe('Alder · Rear: 120 tiles missing; the rest due 8 Mar 2027 on RL-000019.');
  });

  it("lists the crane drop's roof landing plan, pallet by face, each face drawn from the day's own drawing data and roof system", () => {
    const day = driverDay();
    const { renderFaceDrawing } = renderDay(day);
    const faces = screen.getAllByTestId('landing-face');
    expect(faces.map((f) => f.querySelector('p')?.textContent)).toEqual(['Alder · Front ← pallet 1 · 240 tiles', 'Alder · Rear ← pallet 2 · 200 tiles']);
    const drop = day.runs[0]!.drops[0]!;
    expect(renderFaceDrawing).toHaveBeenCalledWith(drop.landing_plan[0]!.drawing, drop.roof_system);
    expect(renderFaceDrawing).toHaveBeenCalledWith(drop.landing_plan[1]!.drawing, drop.roof_system);
    expect(within(faces[1]).getByText(`stacks of Alder Rear, ${drop.landing_plan[1]!.drawing!.result.stacks} of 6`)).toBeTruthy();
  });

  it('says to spread the stacks evenly where a face has no drawing (an order without an estimate)', () => {
    const day = driverDay();
    const drop = day.runs[0]!.drops[0]!;
    day.runs[0]!.drops[0] = driverDrop({ landing_plan: drop.landing_plan.map((f) => ({ ...f, drawing: null, estimate_face_index: null })), roof_system: null, estimate_id: null });
    const { renderFaceDrawing } = renderDay(day);
    expect(renderFaceDrawing).not.toHaveBeenCalled();
    const faces = screen.getAllByTestId('landing-face');
    for (const f of faces) expect(within(f).getByText(/^No drawing for this face: spread the stacks evenly .* both slopes in step\.$/)).toBeTruthy();
  });

  it('shows no landing plan for a drop set down at ground level', () => {
    renderDay();
    fireEvent.click(screen.getByRole('button', { name: /Quarry Rise/ }));
    expect(screen.queryByRole('region', { name: 'Roof landing plan' })).toBeNull();
  });
});
