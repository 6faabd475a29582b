import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { LorriesTable } from './lorries-table';

const crane = { id: 4, branch_id: 3, registration: 'TY61 KRB', name: 'Crane rigid', payload_kg: 12_000, pallet_slots: 10, has_crane: true, crane_max_kg: 1_200, archived_at: null };
const flatbed = { id: 5, branch_id: 3, registration: 'TY62 KRC', name: '', payload_kg: 7_500, pallet_slots: 6, has_crane: false, crane_max_kg: null, archived_at: null };
const csrf = { 'GET /api/auth/csrf': { status: 200, body: { token: 't' } } };
const deletes = (fetchMock: ReturnType<typeof stubFetch>) => fetchMock.mock.calls.filter(([, init]) => init?.method === 'DELETE');

describe('LorriesTable', () => {
  it('asks before archiving, then archives with DELETE and refetches the list without the lorry', async () => {
    const fetchMock = stubFetch({
      ...csrf,
      'GET /api/branches/3/lorries': [
        { status: 200, body: { lorries: [crane, flatbed] } },
        { status: 200, body: { lorries: [flatbed] } },
      ],
      'DELETE /api/lorries/4': { status: 200, body: { ...crane, archived_at: '2027-03-01T08:00:00.000Z' } },
    });
    renderWithProviders(<LorriesTable branchId={3} canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Archive TY61 KRB' }));
    expect(screen.getByText('Archive TY61 KRB?')).toBeTruthy();
    expect(deletes(fetchMock)).toHaveLength(0);
    fireEvent.click(screen.getByRole('button', { name: 'Archive TY61 KRB' }));
    await waitFor(() => expect(deletes(fetchMock).map(([url]) => String(url))).toEqual(['/api/lorries/4']));
    expect(await screen.findByText('TY61 KRB is archived.')).toBeTruthy();
    await waitFor(() => expect(screen.queryByRole('cell', { name: 'TY61 KRB' })).toBeNull());
    expect(screen.getByRole('cell', { name: 'TY62 KRC' })).toBeTruthy();
  });

  it('sends nothing when the archive is called off with "Keep it"', async () => {
    const fetchMock = stubFetch({ ...csrf, 'GET /api/branches/3/lorries': { status: 200, body: { lorries: [crane] } } });
    renderWithProviders(<LorriesTable branchId={3} canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Archive TY61 KRB' }));
    fireEvent.click(screen.getByRole('button', { name: 'Keep it' }));
    expect(screen.queryByText('Archive TY61 KRB?')).toBeNull();
    expect(deletes(fetchMock)).toHaveLength(0);
  });

  it('shows a 409 refusal in words beside the lorry and keeps it in the list', async () => {
    stubFetch({
      ...csrf,
      'GET /api/branches/3/lorries': { status: 200, body: { lorries: [crane] } },
      'DELETE /api/lorries/4': {
        status: 409,
        body: { error: { code: 'lorry_booked', message: 'TY61 KRB has orders booked on coming slots; move them first', details: [{ path: 'id', message: '2 orders on 3 Mar 2027' }] } },
      },
    });
    renderWithProviders(<LorriesTable branchId={3} canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Archive TY61 KRB' }));
    fireEvent.click(screen.getByRole('button', { name: 'Archive TY61 KRB' }));
    const alert = await screen.findByRole('alert');
    expect(within(alert).getByText('TY61 KRB was not archived')).toBeTruthy();
    expect(within(alert).getByText('TY61 KRB has orders booked on coming slots; move them first')).toBeTruthy();
    expect(within(alert).getByText('2 orders on 3 Mar 2027')).toBeTruthy();
    expect(screen.getByRole('cell', { name: 'TY61 KRB' })).toBeTruthy();
  });

  it('lists the archived lorries behind the toggle, asking the API for them', async () => {
    const fetchMock = stubFetch({
      'GET /api/branches/3/lorries': { status: 200, body: { lorries: [flatbed] } },
      'GET /api/branches/3/lorries?archived=true': { status: 200, body: { lorries: [{ ...crane, archived_at: '2027-02-26T09:30:00.000Z' }, flatbed] } },
    });
    renderWithProviders(<LorriesTable branchId={3} canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Show archived lorries' }));
    const list = await screen.findByRole('list', { name: 'Archived lorries' });
    expect(within(list).getByText('TY61 KRB')).toBeTruthy();
    expect(within(list).getByText(/archived 26 Feb 2027/)).toBeTruthy();
    expect(within(list).queryByText('TY62 KRC')).toBeNull();
    expect(fetchMock.mock.calls.some(([url]) => String(url) === '/api/branches/3/lorries?archived=true')).toBe(true);
  });

  it('restores an archived lorry with POST …/restore and says its slots are made again in the calendar', async () => {
    const archivedCrane = { ...crane, archived_at: '2027-02-26T09:30:00.000Z' };
    const fetchMock = stubFetch({
      ...csrf,
      'GET /api/branches/3/lorries': [
        { status: 200, body: { lorries: [flatbed] } },
        { status: 200, body: { lorries: [crane, flatbed] } },
      ],
      'GET /api/branches/3/lorries?archived=true': [
        { status: 200, body: { lorries: [archivedCrane, flatbed] } },
        { status: 200, body: { lorries: [crane, flatbed] } },
      ],
      'POST /api/lorries/4/restore': { status: 200, body: crane },
    });
    renderWithProviders(<LorriesTable branchId={3} canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Show archived lorries' }));
    fireEvent.click(await screen.findByRole('button', { name: 'Restore TY61 KRB' }));
    await waitFor(() => expect(fetchMock.mock.calls.filter(([, init]) => init?.method === 'POST').map(([url]) => String(url))).toEqual(['/api/lorries/4/restore']));
    expect(await screen.findByText('TY61 KRB is back in service; make its slots in the calendar.')).toBeTruthy();
    expect(await screen.findByRole('cell', { name: 'TY61 KRB' })).toBeTruthy();
  });

  it('offers no Archive button to a role without fleet:manage', async () => {
    stubFetch({ 'GET /api/branches/3/lorries': { status: 200, body: { lorries: [crane] } } });
    renderWithProviders(<LorriesTable branchId={3} canManage={false} />);
    expect(await screen.findByRole('cell', { name: 'TY61 KRB' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Archive/ })).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'Show archived lorries' }));
    expect(screen.queryByRole('button', { name: /Restore/ })).toBeNull();
  });
});
