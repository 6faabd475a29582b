import { screen } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { SlotCalendar } from './slot-calendar';

beforeEach(() => {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date(Date.UTC(2027, 2, 1, 9, 0)));
});
afterEach(() => vi.useRealTimers());

const day = {
  branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck' },
  date: '2027-03-01',
  slots: [
    {
      id: 40,
      branch_id: 3,
      date: '2027-03-01',
      time_window: '07:30-12:00',
      lorry: { id: 1, registration: 'RL-TY01', name: 'Three-axle rigid with crane', has_crane: true, crane_max_kg: 1200 },
      driver: null,
      payload_kg: 14000,
      pallet_slots: 12,
      booked_kg: 0,
      booked_pallets: 0,
      remaining_kg: 14000,
      remaining_pallets: 12,
      bookings: [],
    },
  ],
};

describe('SlotCalendar', () => {
  it('names each button beside the driver list by what it does', async () => {
    stubFetch({ 'GET /api/branches/3/slots?date=2027-03-01': { status: 200, body: day }, 'GET /api/drivers': { status: 200, body: { drivers: [{ id: 9, name: 'Kofi Brennagh', email: 'kofi@tollerbeck.test' }] } } });
    renderWithProviders(<SlotCalendar branchId={3} canManage />);
    const change = await screen.findByRole('button', { name: 'Change the time window or driver of 07:30-12:00 RL-TY01' }, { timeout: 5000 });
    expect(change.textContent).toBe('Change time or driver');
    const remove = screen.getByRole('button', { name: 'Remove the slot 07:30-12:00 RL-TY01' });
    expect(remove.textContent).toBe('Remove slot');
    // No button on the page is named by a bare verb.
    for (const button of screen.getAllByRole('button')) expect(['Change', 'Remove', 'Edit']).not.toContain(button.textContent?.trim());
  });
});
