import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { ROLES_BY_KIND } from '../../../../shared/domain/roles';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { TeamMembersSection } from './team-members-section';

const members = [
  { id: 1, email: 'wyn@kestle-roofing.test', name: 'Wyn Kestle', role: 'contractor_owner', created_at: '2026-11-02 09:15:00' },
  { id: 2, email: 'ana@kestle-roofing.test', name: 'Ana Brettle', role: 'contractor_estimator', created_at: '2026-11-20 14:00:00' },
];

describe('TeamMembersSection', () => {
  it('shows a skeleton while loading, then the members in a table', async () => {
    stubFetch({ 'GET /api/members': { status: 200, body: { members } } });
    renderWithProviders(<TeamMembersSection currentUserId={1} canManage={false} assignableRoles={ROLES_BY_KIND.contractor} />);
    expect(screen.getByText('Loading the members')).toBeTruthy();
    const table = await screen.findByRole('table', { name: 'Members' });
    expect(within(table).getByText('Ana Brettle')).toBeTruthy();
    expect(within(table).queryByRole('combobox')).toBeNull();
    expect(within(table).queryByRole('button', { name: /Remove/ })).toBeNull();
  });

  it('offers an owner only the roles of a contractor firm and no way to remove themselves', async () => {
    stubFetch({ 'GET /api/members': { status: 200, body: { members } } });
    renderWithProviders(<TeamMembersSection currentUserId={1} canManage assignableRoles={ROLES_BY_KIND.contractor} />);
    const select = await screen.findByLabelText('Role of Ana Brettle');
    expect(
      within(select)
        .getAllByRole('option')
        .map((option) => option.textContent),
    ).toEqual(['Contractor owner', 'Estimator']);
    expect(screen.getByRole('button', { name: 'Remove Ana Brettle' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Remove Wyn Kestle' })).toBeNull();
  });

  it('changes a role through PATCH and says so in a toast', async () => {
    const fetchMock = stubFetch({
      'GET /api/members': { status: 200, body: { members } },
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'PATCH /api/members/2': { status: 200, body: { ...members[1], role: 'contractor_owner' } },
    });
    renderWithProviders(<TeamMembersSection currentUserId={1} canManage assignableRoles={ROLES_BY_KIND.contractor} />);
    fireEvent.change(await screen.findByLabelText('Role of Ana Brettle'), { target: { value: 'contractor_owner' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save role of Ana Brettle' }));

    expect(await screen.findByText('Ana Brettle is now Contractor owner.')).toBeTruthy();
    const patch = fetchMock.mock.calls.find((call) => (call[1] as RequestInit).method === 'PATCH');
    expect(JSON.parse((patch![1] as RequestInit).body as string)).toEqual({ role: 'contractor_owner' });
  });

  it('shows the server’s refusal when the last owner would be demoted', async () => {
    stubFetch({
      'GET /api/members': { status: 200, body: { members } },
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'PATCH /api/members/1': { status: 409, body: { error: { code: 'last_owner', message: 'A firm needs at least one owner' } } },
    });
    renderWithProviders(<TeamMembersSection currentUserId={1} canManage assignableRoles={ROLES_BY_KIND.contractor} />);
    fireEvent.change(await screen.findByLabelText('Role of Wyn Kestle'), { target: { value: 'contractor_estimator' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save role of Wyn Kestle' }));
    expect(await screen.findByText('A firm needs at least one owner')).toBeTruthy();
    await waitFor(() => expect((screen.getByLabelText('Role of Wyn Kestle') as HTMLSelectElement).value).toBe('contractor_owner'));
  });

  it('shows an error with a retry when the members cannot be loaded', async () => {
    stubFetch({ 'GET /api/members': { status: 500, body: { error: { code: 'internal', message: 'The server had a problem' } } } });
    renderWithProviders(<TeamMembersSection currentUserId={1} canManage={false} assignableRoles={ROLES_BY_KIND.contractor} />);
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('The server had a problem');
    expect(within(alert).getByRole('button', { name: 'Try again' })).toBeTruthy();
  });
});
