import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { SlotCalendar } from './slot-calendar';

// The calendar opens on today; the fixtures use the same day so the page asks for them.
const today = new Date().toISOString().slice(0, 10);
const dayUrl = `GET /api/branches/3/slots?date=${today}`;

const booking = {
  order_id: 88,
  reference: 'RL-000088',
  status: 'confirmed',
  contractor: { id: 12, name: 'Quillsby Roofing' },
  site_name: 'Mill Lane plots 1-6',
  delivery_method: 'ground',
  weight_kg: 2_400,
  pallets: 2,
  heaviest_pallet_kg: 1_150,
};

const slot = {
  id: 21,
  branch_id: 3,
  date: today,
  time_window: '07:30-12:00',
  lorry: { id: 4, registration: 'TY61 KRB', name: 'Crane rigid', has_crane: true, crane_max_kg: 1_200 },
  driver: { id: 9, name: 'Dee Fenwick' } as { id: number; name: string } | null,
  payload_kg: 12_000,
  pallet_slots: 10,
  booked_kg: 0,
  booked_pallets: 0,
  remaining_kg: 12_000,
  remaining_pallets: 10,
  bookings: [] as (typeof booking)[],
};

const day = (slots: (typeof slot)[]) => ({ status: 200, body: { branch: { id: 3, name: 'North yard', town: 'Quennick' }, date: today, slots } });
const base = {
  'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
  'GET /api/drivers': {
    status: 200,
    body: {
      drivers: [
        { id: 9, name: 'Dee Fenwick', email: 'dee@northyard.test' },
        { id: 10, name: 'Sol Brant', email: 'sol@northyard.test' },
      ],
    },
  },
};
const sent = (fetchMock: ReturnType<typeof stubFetch>, method: string, path: string) =>
  fetchMock.mock.calls.filter(([url, init]) => String(url) === path && init?.method === method).map(([, init]) => (init?.body ? JSON.parse(String(init.body)) : undefined));

async function slotItem() {
  const heading = await screen.findByRole('heading', { name: /07:30-12:00 · TY61 KRB/ });
  return heading.closest('li') as HTMLElement;
}

describe('SlotCalendar', () => {
  it('sends only the new window when a slot is changed, and shows the 409 refusal at the slot', async () => {
    const fetchMock = stubFetch({
      ...base,
      [dayUrl]: day([slot]),
      'PATCH /api/slots/21': { status: 409, body: { error: { code: 'slot_exists', message: `TY61 KRB already has a slot on ${today} at 12:30-16:30` } } },
    });
    renderWithProviders(<SlotCalendar branchId={3} canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Change the time window or driver of 07:30-12:00 TY61 KRB' }));
    const item = await slotItem();
    const form = await within(item).findByRole('form', { name: 'Change the slot 07:30-12:00 of TY61 KRB' });
    await within(form).findByRole('option', { name: 'Sol Brant' });
    fireEvent.change(within(form).getByLabelText('Time window'), { target: { value: '12:30 - 16:30' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save the slot' }));
    await waitFor(() => expect(sent(fetchMock, 'PATCH', '/api/slots/21')).toEqual([{ time_window: '12:30-16:30' }]));
    expect(await within(item).findByText(`TY61 KRB already has a slot on ${today} at 12:30-16:30`)).toBeTruthy();
    expect(within(item).getByRole('button', { name: 'Save the slot' })).toBeTruthy();
  });

  it('takes the driver off with driver_id null, closes the form and refetches the day', async () => {
    const fetchMock = stubFetch({
      ...base,
      [dayUrl]: [day([slot]), day([{ ...slot, driver: null }])],
      'PATCH /api/slots/21': { status: 200, body: { ...slot, driver: null } },
    });
    renderWithProviders(<SlotCalendar branchId={3} canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Change the time window or driver of 07:30-12:00 TY61 KRB' }));
    const item = await slotItem();
    const form = await within(item).findByRole('form', { name: 'Change the slot 07:30-12:00 of TY61 KRB' });
    fireEvent.change(within(form).getByLabelText('Driver'), { target: { value: '' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save the slot' }));
    await waitFor(() => expect(sent(fetchMock, 'PATCH', '/api/slots/21')).toEqual([{ driver_id: null }]));
    await waitFor(() => expect(screen.queryByRole('form', { name: 'Change the slot 07:30-12:00 of TY61 KRB' })).toBeNull());
    await waitFor(() => expect(fetchMock.mock.calls.filter(([url]) => String(url) === dayUrl.slice(4))).toHaveLength(2));
  });

  it('sends nothing when the change form is saved unchanged, and says so', async () => {
    const fetchMock = stubFetch({ ...base, [dayUrl]: day([slot]) });
    renderWithProviders(<SlotCalendar branchId={3} canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Change the time window or driver of 07:30-12:00 TY61 KRB' }));
    const item = await slotItem();
    fireEvent.click(await within(item).findByRole('button', { name: 'Save the slot' }));
    expect(await within(item).findByText(/Nothing is changed yet/)).toBeTruthy();
    expect(sent(fetchMock, 'PATCH', '/api/slots/21')).toHaveLength(0);
  });

  it('asks before removing a slot, then removes it with DELETE and the day no longer lists it', async () => {
    const fetchMock = stubFetch({ ...base, [dayUrl]: [day([slot]), day([])], 'DELETE /api/slots/21': { status: 204 } });
    renderWithProviders(<SlotCalendar branchId={3} canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Remove the slot 07:30-12:00 TY61 KRB' }));
    expect(screen.getByText(/Nothing is booked on it/)).toBeTruthy();
    expect(sent(fetchMock, 'DELETE', '/api/slots/21')).toHaveLength(0);
    fireEvent.click(screen.getByRole('button', { name: 'Remove the slot' }));
    await waitFor(() => expect(sent(fetchMock, 'DELETE', '/api/slots/21')).toHaveLength(1));
    expect(await screen.findByText(/^No slots on/)).toBeTruthy();
    expect(await screen.findByText(`Slot removed: TY61 KRB, ${today} 07:30-12:00.`)).toBeTruthy();
  });

  it('shows the 409 for a slot with orders booked at the slot, and keeps the slot', async () => {
    const booked = { ...slot, booked_kg: 2_400, booked_pallets: 2, remaining_kg: 9_600, remaining_pallets: 8, bookings: [booking] };
    stubFetch({
      ...base,
      [dayUrl]: day([booked]),
      'DELETE /api/slots/21': { status: 409, body: { error: { code: 'slot_booked', message: 'Orders are booked into this slot: move them first' } } },
    });
    renderWithProviders(<SlotCalendar branchId={3} canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Remove the slot 07:30-12:00 TY61 KRB' }));
    const item = await slotItem();
    expect(within(item).getByText(/One order is booked on it/)).toBeTruthy();
    fireEvent.click(within(item).getByRole('button', { name: 'Remove the slot' }));
    const alert = await within(item).findByRole('alert');
    expect(within(alert).getByText('The slot was not removed')).toBeTruthy();
    expect(within(alert).getByText('Orders are booked into this slot: move them first')).toBeTruthy();
    expect(within(item).getByText('RL-000088')).toBeTruthy();
  });

  it('opens the run of a booked load in one click, and sends nothing out from the calendar', async () => {
    const booked = { ...slot, booked_kg: 2_400, booked_pallets: 2, remaining_kg: 9_600, remaining_pallets: 8, bookings: [booking] };
    stubFetch({ ...base, [dayUrl]: day([booked]) });
    renderWithProviders(<SlotCalendar branchId={3} canManage />);
    const item = await slotItem();
    expect(within(item).getByRole('link', { name: 'RL-000088: open its run' }).getAttribute('href')).toBe('/yard/runs/21');
    expect(
      within(item)
        .getByRole('link', { name: /^Open the run/ })
        .getAttribute('href'),
    ).toBe('/yard/runs/21');
    expect(within(item).queryByRole('button', { name: 'Send out' })).toBeNull();
  });

  it('offers no Change or Remove to a role without fleet:manage', async () => {
    stubFetch({ ...base, [dayUrl]: day([slot]) });
    renderWithProviders(<SlotCalendar branchId={3} canManage={false} />);
    const item = await slotItem();
    expect(within(item).getByText('Driver: Dee Fenwick')).toBeTruthy();
    expect(within(item).queryByRole('button', { name: /Change|Remove/ })).toBeNull();
  });

  it('names each button beside the driver list by what it does', async () => {
    stubFetch({ ...base, [dayUrl]: day([{ ...slot, driver: null }]) });
    renderWithProviders(<SlotCalendar branchId={3} canManage />);
    const change = await screen.findByRole('button', { name: 'Change the time window or driver of 07:30-12:00 TY61 KRB' }, { timeout: 5000 });
    expect(change.textContent).toBe('Change time or driver');
    const remove = screen.getByRole('button', { name: 'Remove the slot 07:30-12:00 TY61 KRB' });
    expect(remove.textContent).toBe('Remove slot');
    // No button on the page is named by a bare verb.
    for (const button of screen.getAllByRole('button')) expect(['Change', 'Remove', 'Edit']).not.toContain(button.textContent?.trim());
  });
});
