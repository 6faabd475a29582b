import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { PalletView } from '../../../../shared/schemas/run.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { PalletCard } from './pallet-card';

const pallet = (overrides: Partial<PalletView> = {}): PalletView => ({
  order_id: 15,
  reference: 'RL-000015',
  site_name: 'Hollin Brow, plots 1–20',
  pallet: 2,
  pallets: 3,
  drop: 1,
  drops: 3,
  run_id: 7,
  position_index: 4,
  weight_kg: 900,
  faces: [{ building: 'Alder', face: 'Front', tiles: 240 }],
  items: [{ description: 'Interlocking tile, slate grey', quantity: 240, unit: 'tile' }],
  loaded: false,
  ...overrides,
});

describe('PalletCard', () => {
  it('shows what a label’s pallet is and where it goes, and marks it loaded with one big button', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'POST /api/runs/7/positions/4/loaded': { status: 200, body: {} },
    });
    renderWithProviders(<PalletCard pallet={pallet()} canLoad />);
    const text = screen.getByRole('article', { name: 'Pallet 2 of RL-000015' }).textContent;
    for (const part of ['RL-000015', 'Hollin Brow, plots 1–20', '1 of 3', '2 of 3', '900 kg', 'Alder · Front: 240 tiles', 'Interlocking tile, slate grey', '240 tile']) expect(text).toContain(part);
    fireEvent.click(screen.getByRole('button', { name: 'Mark loaded' }));
    await waitFor(() => expect(fetchMock.mock.calls.some(([url, init]) => String(url) === '/api/runs/7/positions/4/loaded' && init?.method === 'POST')).toBe(true));
    expect(screen.getByRole('link', { name: 'Open the whole run' }).getAttribute('href')).toBe('/yard/runs/7');
  });

  it('says a loaded pallet is loaded, offers to untick it, and says when the order is on no run', () => {
    const { unmount } = renderWithProviders(<PalletCard pallet={pallet({ loaded: true })} canLoad />);
    expect(screen.getByRole('status').textContent).toContain('Loaded');
    expect(screen.queryByRole('button', { name: 'Mark loaded' })).toBeNull();
    expect(screen.getByRole('button', { name: 'Not loaded after all' })).toBeTruthy();
    unmount();
    renderWithProviders(<PalletCard pallet={pallet({ run_id: null, position_index: null, drop: null, drops: null })} canLoad />);
    expect(screen.getByText('Not on a lorry yet')).toBeTruthy();
    expect(screen.queryByRole('button')).toBeNull();
  });
});
