import { useState } from 'react';
import { ROLE_LABELS } from '../../../../shared/domain/roles';
import type { Invitation } from '../../../../shared/schemas/members.schema';
import { ErrorAlert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useToast } from '../../../components/ui/toast';
import { formatDateTime } from '../../../lib/format';
import { useInvitations } from '../api/get-invitations';
import { useRevokeInvitation } from '../api/revoke-invitation';
import { focusOnShow } from '../../../lib/focus-on-show';

function InvitationRow({ invitation }: { invitation: Invitation }) {
  const revoke = useRevokeInvitation();
  const toast = useToast();
  const [confirming, setConfirming] = useState(false);

  return (
    <li className="flex flex-wrap items-center justify-between gap-3 py-3">
      <div className="min-w-0">
        <p className="font-medium break-all">{invitation.email}</p>
        <p className="text-sm text-ink-600">
          {ROLE_LABELS[invitation.role]} · expires {formatDateTime(invitation.expires_at)}
        </p>
      </div>
      {confirming ? (
        <div role="group" aria-label={`Withdraw the invitation to ${invitation.email}?`} className="flex gap-2">
          <Button
            variant="danger"
            ref={focusOnShow}
            busy={revoke.isPending}
            onClick={() =>
              revoke.mutate(invitation.id, {
                onSuccess: () => toast.show(`Invitation to ${invitation.email} withdrawn.`, 'success'),
                onError: (error) => {
                  setConfirming(false);
                  toast.show(errorMessage(error), 'danger');
                },
              })
            }
          >
            Yes, withdraw
          </Button>
          <Button variant="secondary" onClick={() => setConfirming(false)}>
            Keep
          </Button>
        </div>
      ) : (
        <Button variant="secondary" onClick={() => setConfirming(true)} aria-label={`Withdraw the invitation to ${invitation.email}`}>
          Withdraw
        </Button>
      )}
    </li>
  );
}

export function PendingInvitations() {
  const invitations = useInvitations();
  return (
    <Card title="Pending invitations">
      {invitations.isPending ? (
        <SkeletonBlock label="Loading the invitations" lines={2} />
      ) : invitations.isError ? (
        <ErrorAlert error={invitations.error} title="The invitations could not be loaded" onRetry={() => void invitations.refetch()} />
      ) : invitations.data.length === 0 ? (
        <EmptyState title="No invitations waiting">Everyone you invited has joined, or nobody is invited yet.</EmptyState>
      ) : (
        <ul className="divide-y divide-mortar-200">
          {invitations.data.map((invitation) => (
            <InvitationRow key={invitation.id} invitation={invitation} />
          ))}
        </ul>
      )}
    </Card>
  );
}
