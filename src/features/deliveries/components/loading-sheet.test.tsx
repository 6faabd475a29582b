import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { LoadingSheet as LoadingSheetData } from '../../../../shared/schemas/slot.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { LoadingSheet } from './loading-sheet';

/** An invented day: one crane run to one site, two pallets of tiles, loaded in the order the engine planned. */
function sheet(status = 'on_the_road'): LoadingSheetData {
  return {
    date: '2027-03-01',
    driver: { id: 8, name: 'Kofi Brennagh' },
    runs: [
      {
        slot_id: 40,
        time_window: '07:30-12:00',
        lorry: { id: 1, registration: 'RL-TY01', has_crane: true, crane_max_kg: 1200 },
        weight_kg: 2150,
        pallets: 2,
        stops: [
          {
            order_id: 1,
            reference: 'RL-000001',
            status,
            contractor: { id: 5, name: 'Brackenfold Roofworks' },
            site: {
              name: 'Hollin Brow, plots 1–20',
              site_address: 'Hollin Brow, Tollerbeck',
              site_postcode: '',
              contact_name: 'Gethin Marlow',
              contact_phone: '07700 900 001',
              vehicle_access: 'rigid_only',
              crane_lift: 'allowed',
              overhead_lines: 'present',
              set_down_place: 'Hardstanding by the cabin',
              access_notes: '',
            },
            delivery_method: 'roof',
            weight_kg: 2150,
            pallets: [
              { load_position: 2, n: 1, kind: 'tiles', weight_kg: 1080, tiles: 240, faces: [{ building: 'Alder', face: 'Front', tiles: 240 }], items: [] },
              { load_position: 1, n: 2, kind: 'tiles', weight_kg: 1070, tiles: 238, faces: [{ building: 'Alder', face: 'Rear', tiles: 200 }, { building: 'spare', face: '', tiles: 38 }], items: [] },
              { load_position: 3, n: 3, kind: 'accessories', weight_kg: 96, tiles: 0, faces: [], items: [{ item: 'ridge_tiles', quantity: 24, weight_kg: 96 }] },
            ],
            lines: [{ line_id: 101, sku: 'TRS-FL420-SG', description: 'Interlocking tile, slate grey', unit: 'pack', quantity: 2 }],
            notes: ['Set down: Hardstanding by the cabin'],
            cautions: ['Overhead lines on site: keep the crane clear'],
          },
        ],
      },
    ],
  };
}

describe('LoadingSheet', () => {
  it('lists the pallets in loading order with the roof faces each serves, and the cautions', () => {
    renderWithProviders(<LoadingSheet sheet={sheet()} />);
    const pallets = screen.getAllByTestId('pallet');
    expect(pallets.map((p) => p.querySelector('p')?.textContent)).toEqual(['Load 1st: pallet 2 · 238 tiles', 'Load 2nd: pallet 1 · 240 tiles', 'Load 3rd: pallet 3 · accessories']);
    // Accessories are named in words, not the engine's keys.
    expect(within(pallets[2]).getByText('Ridge tiles: 24')).toBeTruthy();
    expect(within(pallets[0]).getByText('Alder · Rear')).toBeTruthy();
    expect(within(pallets[0]).getByText('spare (waste allowance)')).toBeTruthy();
    expect(screen.getByText('Overhead lines on site: keep the crane clear')).toBeTruthy();
    expect(screen.getByText('Set down: Hardstanding by the cabin')).toBeTruthy();
    expect(screen.getByRole('link', { name: /Call Gethin Marlow/ }).getAttribute('href')).toBe('tel:07700900001');
  });

  it('records the delivery with the packs handed over and who took them, with phone-sized targets', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/orders/1/delivery': { status: 500, body: { error: { code: 'internal', message: 'stop here' } } } });
    renderWithProviders(<LoadingSheet sheet={sheet()} />);
    fireEvent.click(screen.getByText('Record the delivery'));
    const delivered = screen.getByRole('button', { name: 'Delivered' });
    expect(delivered.className).toContain('min-h-tap-lg');
    fireEvent.click(delivered);
    expect(await screen.findByText('name the person who took the delivery')).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Interlocking tile, slate grey: packs handed over'), { target: { value: '1' } });
    fireEvent.change(screen.getByLabelText('Taken by (name)'), { target: { value: 'Gethin Marlow' } });
    fireEvent.click(delivered);
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/api/orders/1/delivery'));
      expect(call && JSON.parse(String(call[1]?.body))).toEqual({ received_by: 'Gethin Marlow', lines: [{ line_id: 101, delivered_quantity: 1 }] });
    });
  });

  it('offers no delivery form for a stop not yet on the road', () => {
    renderWithProviders(<LoadingSheet sheet={sheet('confirmed')} />);
    expect(screen.queryByText('Record the delivery')).toBeNull();
    expect(screen.getByText(/Not sent out yet/)).toBeTruthy();
  });

  it('leaves out slots with nothing booked, saying how many there were', () => {
    const day = sheet();
    day.runs.push({ slot_id: 41, time_window: '12:30-16:30', lorry: { id: 1, registration: 'RL-TY01', has_crane: true, crane_max_kg: 1200 }, weight_kg: 0, pallets: 0, stops: [] });
    renderWithProviders(<LoadingSheet sheet={day} />);
    expect(screen.queryByRole('region', { name: 'Run 12:30-16:30 on RL-TY01' })).toBeNull();
    expect(screen.getByRole('region', { name: 'Run 07:30-12:00 on RL-TY01' })).toBeTruthy();
    expect(screen.getByText('One more slot of yours has nothing booked.')).toBeTruthy();
  });
});
