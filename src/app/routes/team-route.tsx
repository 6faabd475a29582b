import { can } from '../../../shared/domain/policy';
import { ROLES_BY_KIND } from '../../../shared/domain/roles';
import { SectionBoundary } from '../../components/errors/section-boundary';
import { PageHeader } from '../../components/ui/page-header';
import { InviteMemberForm } from '../../features/team/components/invite-member-form';
import { PendingInvitations } from '../../features/team/components/pending-invitations';
import { TeamMembersSection } from '../../features/team/components/team-members-section';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';

export function TeamRoute() {
  usePageTitle('Team');
  const { user, organisation } = useCurrentSession();
  const canManage = can(user.role, 'members:manage');
  const assignableRoles = ROLES_BY_KIND[organisation.kind];
  return (
    <>
      <PageHeader title="Team" lead={canManage ? `Everyone at ${organisation.name}. Change roles, remove people and invite new ones.` : `Everyone at ${organisation.name}.`} />
      <div className="space-y-6">
        <SectionBoundary name="members">
          <TeamMembersSection currentUserId={user.id} canManage={canManage} assignableRoles={assignableRoles} />
        </SectionBoundary>
        {canManage ? (
          <div className="grid items-start gap-6 xl:grid-cols-2">
            <SectionBoundary name="invitation form">
              <InviteMemberForm assignableRoles={assignableRoles} />
            </SectionBoundary>
            <SectionBoundary name="invitations">
              <PendingInvitations />
            </SectionBoundary>
          </div>
        ) : null}
      </div>
    </>
  );
}
