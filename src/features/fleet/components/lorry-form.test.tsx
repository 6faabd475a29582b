import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { LorryForm } from './lorry-form';

const lorry = {
  id: 4,
  branch_id: 3,
  registration: 'TY61 KRB',
  name: 'Crane rigid',
  payload_kg: 12_000,
  pallet_slots: 10,
  has_crane: true,
  crane_max_kg: 1_200,
  deck_length_mm: 7300,
  deck_width_mm: 2450,
  archived_at: null,
};

describe('LorryForm', () => {
  it('refuses a payload typed in tonnes, naming the payload field, and sends nothing', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<LorryForm branchId={3} />);
    fireEvent.change(screen.getByLabelText('Registration'), { target: { value: 'ty61 krc' } });
    // 18 t is 18,000 kg (SI Brochure, BIPM: 1 t = 1000 kg); a bare "18" reads as kg and is under the 100 kg floor.
    fireEvent.change(screen.getByLabelText('Payload (kg)'), { target: { value: '18' } });
    fireEvent.change(screen.getByLabelText('Pallet slots on the bed'), { target: { value: '12' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add the lorry' }));
    expect(await screen.findByText('must be at least 100 kg')).toBeTruthy();
    expect(screen.getByLabelText('Payload (kg)').getAttribute('aria-invalid')).toBe('true');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('asks for the lifting limit when the crane box is ticked without one', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<LorryForm branchId={3} />);
    fireEvent.change(screen.getByLabelText('Registration'), { target: { value: 'TY61 KRC' } });
    fireEvent.change(screen.getByLabelText('Payload (kg)'), { target: { value: '18000' } });
    fireEvent.change(screen.getByLabelText('Pallet slots on the bed'), { target: { value: '12' } });
    fireEvent.click(screen.getByLabelText('Has a crane (lorry-mounted)'));
    fireEvent.click(screen.getByRole('button', { name: 'Add the lorry' }));
    expect(await screen.findByText('give the heaviest load the crane lifts, in kg')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('adds a lorry with its registration upper-cased and thousands separators read as kg', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/branches/3/lorries': { status: 201, body: { ...lorry, id: 5, registration: 'TY61 KRC' } } });
    renderWithProviders(<LorryForm branchId={3} />);
    fireEvent.change(screen.getByLabelText('Registration'), { target: { value: 'ty61 krc' } });
    fireEvent.change(screen.getByLabelText('Payload (kg)'), { target: { value: '18,000' } });
    fireEvent.change(screen.getByLabelText('Pallet slots on the bed'), { target: { value: '12' } });
    fireEvent.click(screen.getByLabelText('Has a crane (lorry-mounted)'));
    fireEvent.change(screen.getByLabelText('Crane lifting limit (kg)'), { target: { value: '1500' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add the lorry' }));
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/api/branches/3/lorries'));
      expect(call && JSON.parse(String(call[1]?.body))).toEqual({
        registration: 'TY61 KRC',
        name: '',
        payload_kg: 18_000,
        pallet_slots: 12,
        has_crane: true,
        crane_max_kg: 1_500,
        deck_length_mm: 7300,
        deck_width_mm: 2450,
      });
    });
  });

  it('clears the lifting limit when the crane box is unticked on an existing lorry', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'PATCH /api/lorries/4': { status: 200, body: { ...lorry, has_crane: false, crane_max_kg: null } } });
    renderWithProviders(<LorryForm branchId={3} lorry={lorry} />);
    fireEvent.click(screen.getByLabelText('Has a crane (lorry-mounted)'));
    fireEvent.click(screen.getByRole('button', { name: 'Save the lorry' }));
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/api/lorries/4'));
      expect(call && JSON.parse(String(call[1]?.body))).toMatchObject({ has_crane: false, crane_max_kg: null, payload_kg: 12_000 });
    });
  });
});
