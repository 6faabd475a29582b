import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { GenerateSlotsForm } from './slot-forms';

const lorries = [
  { id: 4, branch_id: 3, registration: 'TY61 KRB', name: 'Crane rigid', payload_kg: 12_000, pallet_slots: 10, has_crane: true, crane_max_kg: 1_200, deck_length_mm: 7300, deck_width_mm: 2450, archived_at: null },
  { id: 5, branch_id: 3, registration: 'TY62 KRC', name: '', payload_kg: 7_500, pallet_slots: 6, has_crane: false, crane_max_kg: null, deck_length_mm: 7300, deck_width_mm: 2450, archived_at: null },
];

describe('GenerateSlotsForm', () => {
  it('sends every window for the ticked lorry on the ticked weekdays', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/branches/3/slots/generate': { status: 201, body: { created: 8, skipped: 0 } } });
    renderWithProviders(<GenerateSlotsForm branchId={3} lorries={lorries} />);
    fireEvent.change(screen.getByLabelText('First day'), { target: { value: '2027-03-01' } });
    fireEvent.change(screen.getByLabelText('Last day'), { target: { value: '2027-03-14' } });
    fireEvent.change(screen.getByLabelText(/^Time windows/), { target: { value: '07:30-12:00, 12:30 - 16:30' } });
    fireEvent.click(screen.getByLabelText('Wed'));
    fireEvent.click(screen.getByLabelText('TY62 KRC'));
    fireEvent.click(screen.getByRole('button', { name: 'Make the slots' }));
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/api/branches/3/slots/generate'));
      expect(call && JSON.parse(String(call[1]?.body))).toEqual({ from: '2027-03-01', to: '2027-03-14', windows: ['07:30-12:00', '12:30-16:30'], weekdays: [1, 2, 4, 5], lorry_ids: [5] });
    });
  });

  it('names the window that ends before it starts, and sends nothing', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<GenerateSlotsForm branchId={3} lorries={lorries} />);
    fireEvent.change(screen.getByLabelText('First day'), { target: { value: '2027-03-01' } });
    fireEvent.change(screen.getByLabelText('Last day'), { target: { value: '2027-03-05' } });
    fireEvent.change(screen.getByLabelText(/^Time windows/), { target: { value: '07:30-12:00, 16:00-13:00' } });
    fireEvent.click(screen.getByRole('button', { name: 'Make the slots' }));
    expect(await screen.findByText('"16:00-13:00": must end after it starts')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });
});
