import type { Role } from '../../../../shared/domain/roles';
import { Card } from '../../../components/ui/card';
import { ErrorAlert } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useMembers } from '../api/get-members';
import { MembersTable } from './members-table';

interface TeamMembersSectionProps {
  currentUserId: number;
  canManage: boolean;
  assignableRoles: readonly Role[];
}

export function TeamMembersSection({ currentUserId, canManage, assignableRoles }: TeamMembersSectionProps) {
  const members = useMembers();
  return (
    <Card title="Members">
      {members.isPending ? (
        <SkeletonBlock label="Loading the members" lines={4} />
      ) : members.isError ? (
        <ErrorAlert error={members.error} title="The members could not be loaded" onRetry={() => void members.refetch()} />
      ) : members.data.length === 0 ? (
        <EmptyState title="No members yet" />
      ) : (
        <MembersTable members={members.data} currentUserId={currentUserId} canManage={canManage} assignableRoles={assignableRoles} />
      )}
    </Card>
  );
}
