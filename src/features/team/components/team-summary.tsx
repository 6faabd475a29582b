import type { ReactNode } from 'react';
import { ROLE_LABELS } from '../../../../shared/domain/roles';
import { ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useMembers } from '../api/get-members';

interface TeamSummaryProps {
  /** A link to the full team page, when the person may open it. */
  footer?: ReactNode;
  limit?: number;
}

/** Who works here, in short: for the role homes. */
export function TeamSummary({ footer, limit = 6 }: TeamSummaryProps) {
  const members = useMembers();
  return (
    <Card title="Team">
      {members.isPending ? (
        <SkeletonBlock label="Loading the team" lines={3} />
      ) : members.isError ? (
        <ErrorAlert error={members.error} title="The team could not be loaded" onRetry={() => void members.refetch()} />
      ) : members.data.length === 0 ? (
        <EmptyState title="Nobody here yet" />
      ) : (
        <>
          <p className="mb-3 text-sm text-ink-600">{members.data.length === 1 ? '1 person' : `${members.data.length} people`} in the organisation</p>
          <ul className="divide-y divide-mortar-200">
            {[...members.data]
              .sort((a, b) => a.name.localeCompare(b.name))
              .slice(0, limit)
              .map((member) => (
                <li key={member.id} className="flex flex-wrap items-baseline justify-between gap-x-3 py-2">
                  <span className="font-medium">{member.name}</span>
                  <span className="text-sm text-ink-600">{ROLE_LABELS[member.role]}</span>
                </li>
              ))}
          </ul>
        </>
      )}
      {footer ? <div className="mt-4">{footer}</div> : null}
    </Card>
  );
}
