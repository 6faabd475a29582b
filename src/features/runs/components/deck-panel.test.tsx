import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { runFixture } from '../../../test-utils/run-fixture';
import { DeckDrawing } from './deck-drawing';
import { DeckPanel } from './deck-panel';

const csrf = { 'GET /api/auth/csrf': { status: 200, body: { token: 't' } } };
const calls = (fetchMock: ReturnType<typeof stubFetch>, method: string) => fetchMock.mock.calls.filter(([, init]) => (init?.method ?? 'GET') === method).map(([url]) => String(url));

/** The fill pattern a drawn pallet uses, read from its rectangle. */
const fillOf = (pallet: Element) => pallet.querySelector('rect')?.getAttribute('fill') ?? '';

describe('DeckDrawing', () => {
  it('draws every pallet of the plan once, numbered with its drop and its number in the order', () => {
    const run = runFixture();
    renderWithProviders(<DeckDrawing run={run} />);
    const pallets = screen.getAllByTestId('deck-pallet');
    expect(pallets).toHaveLength(6);
    expect(pallets.map((p) => [...p.querySelectorAll('text')].map((t) => t.textContent).join(' | '))).toEqual([
      'D3 | P1 · 900 | Rear +1',
      'D2 | P1 · 900 | Front',
      'D2 | P2 · 880 | Front',
      'D1 | P1 · 900 | Front',
      'D1 | P2 · 900 | Front',
      'D1 | P3 · 900 | accessories',
    ]);
    // Not interactive without onToggle: one picture with a text alternative.
    const drawing = screen.getByRole('img', { name: 'Deck plan of TY61 KRB' });
    expect(drawing.getAttribute('aria-describedby')).toBeTruthy();
    expect(screen.getByText(/6 pallets in 7 rows of two, 0 loaded\. Left 2,700 kg, right 2,680 kg; centre of gravity 3\.90 m from the front\./)).toBeTruthy();
    expect(screen.queryByRole('button')).toBeNull();
  });

  it('gives each drop its own pattern, the same on all of its pallets, and defines each pattern once', () => {
    renderWithProviders(<DeckDrawing run={runFixture()} />);
    const pallets = screen.getAllByTestId('deck-pallet');
    const fillByDrop = new Map<string, Set<string>>();
    for (const p of pallets) {
      const drop = p.getAttribute('data-drop')!;
      fillByDrop.set(drop, (fillByDrop.get(drop) ?? new Set()).add(fillOf(p)));
    }
    expect([...fillByDrop.keys()].sort()).toEqual(['1', '2', '3']);
    for (const fills of fillByDrop.values()) expect(fills.size).toBe(1);
    const fills = [...fillByDrop.values()].map((s) => [...s][0]!);
    expect(new Set(fills).size).toBe(3);
    // The patterns differ in shape as well as colour.
    const drawing = screen.getByTestId('deck-drawing');
    const kinds = fills.map((fill) => drawing.querySelector(`pattern[id="${fill.slice(5, -1)}"]`)?.getAttribute('data-pattern'));
    expect(new Set(kinds).size).toBe(3);
    expect(kinds.every(Boolean)).toBe(true);
  });

  it('places the rear pallets at the rear of the deck, to scale', () => {
    renderWithProviders(<DeckDrawing run={runFixture()} />);
    const boxes = screen.getAllByTestId('deck-pallet').map((p) => p.querySelector('rect')!);
    const y = boxes.map((b) => Number(b.getAttribute('y')));
    // A 7,300 × 2,450 mm deck takes 1,200 × 1,000 mm pallets turned, 1,200 across: 7 rows of 1,000 mm
    // (shared deck geometry); each is drawn 960 mm deep, 20 mm into its row.
    expect(y[0]).toBeCloseTo(20, 5);
    expect(y[5]).toBeCloseTo(5 * 1000 + 20, 5);
    expect(Number(boxes[0]!.getAttribute('width'))).toBeCloseTo(1185, 5);
    expect(Number(boxes[1]!.getAttribute('x'))).toBe(0 + (1225 - 1185) / 2);
    expect(Number(boxes[2]!.getAttribute('x'))).toBe(1225 + (1225 - 1185) / 2);
  });
});

describe('DeckPanel', () => {
  it('ticks a pallet loaded when it is tapped on the drawing, and shows it ticked', async () => {
    const run = runFixture();
    const fetchMock = stubFetch({ ...csrf, 'POST /api/runs/7/positions/3/loaded': { status: 200, body: {} }, 'GET /api/runs/7': { status: 200, body: run } });
    renderWithProviders(<DeckPanel run={run} canBuild />);
    const pallet = screen.getByRole('button', { name: 'Pallet 1 of RL-000015, drop 1, row 5 left, 900 kg' });
    expect(pallet.getAttribute('aria-pressed')).toBe('false');
    fireEvent.click(pallet);
    await waitFor(() => expect(calls(fetchMock, 'POST')).toEqual(['/api/runs/7/positions/3/loaded']));
    expect(calls(fetchMock, 'DELETE')).toEqual([]);
  });

  it('unticks a loaded pallet with DELETE, from the drawing or from the list', async () => {
    const base = runFixture();
    const run = { ...base, loaded_count: 1, deck: { ...base.deck, positions: base.deck.positions.map((p, i) => (i === 0 ? { ...p, loaded: true } : p)) } };
    const fetchMock = stubFetch({ ...csrf, 'DELETE /api/runs/7/positions/0/loaded': { status: 204 }, 'POST /api/runs/7/positions/5/loaded': { status: 200, body: {} } });
    renderWithProviders(<DeckPanel run={run} canBuild />);
    const loaded = screen.getByRole('button', { name: /^Pallet 1 of RL-000017, drop 3, row 1 left, 900 kg, loaded$/ });
    expect(loaded.getAttribute('aria-pressed')).toBe('true');
    expect(within(loaded).getByTestId('deck-tick')).toBeTruthy();
    expect(screen.getAllByTestId('deck-tick')).toHaveLength(1);
    fireEvent.keyDown(loaded, { key: 'Enter' });
    await waitFor(() => expect(calls(fetchMock, 'DELETE')).toEqual(['/api/runs/7/positions/0/loaded']));
    fireEvent.click(screen.getByRole('checkbox', { name: 'Loaded: Pallet 3 of RL-000015, drop 1, row 6 right, 900 kg' }));
    await waitFor(() => expect(calls(fetchMock, 'POST')).toEqual(['/api/runs/7/positions/5/loaded']));
  });

  it('lists the pallets in loading order with a checkbox each, and says how many are loaded', () => {
    renderWithProviders(<DeckPanel run={runFixture()} canBuild />);
    const list = screen.getByRole('list', { name: 'Pallets in loading order' });
    expect(within(list).getAllByRole('checkbox')).toHaveLength(6);
    expect(within(list).getAllByRole('listitem')[0]!.textContent).toContain('Pallet 1 of RL-000017, drop 3, row 1 left');
    expect(screen.getByText(/pallets loaded/).textContent).toContain('0 of 6');
  });

  it('shows the plan without taps or checkboxes to someone who does not load', () => {
    renderWithProviders(<DeckPanel run={runFixture()} canBuild={false} />);
    expect(screen.queryByRole('button', { name: /^Pallet/ })).toBeNull();
    for (const box of screen.getAllByRole('checkbox')) expect((box as HTMLInputElement).disabled).toBe(true);
  });

  it('shows the plan’s warnings', () => {
    const base = runFixture();
    renderWithProviders(<DeckPanel run={{ ...base, deck: { ...base.deck, warnings: [{ code: 'crane_limit', message: 'Pallet 1 of RL-000017 weighs 900 kg: more than the crane lifts' }] } }} canBuild />);
    expect(screen.getByText('Pallet 1 of RL-000017 weighs 900 kg: more than the crane lifts')).toBeTruthy();
  });
});
