import { useNavigate, useParams } from 'react-router-dom';
import { AuthCard } from '../../components/layout/public-layout';
import { Alert } from '../../components/ui/alert';
import { useSession } from '../../features/auth/api/get-session';
import { AcceptInvitation } from '../../features/auth/components/accept-invitation-form';
import { usePageTitle } from '../../lib/use-page-title';
import { homePathForRole } from '../home-path';

export function AcceptInvitationRoute() {
  usePageTitle('Join your team');
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const session = useSession();
  return (
    <AuthCard title="Join your team" lead="You have been invited to work in Ridgeload.">
      {session.data ? (
        <Alert tone="info" className="mb-6" title={`You are signed in as ${session.data.user.name}`}>
          Accepting signs this browser in as the invited person instead.
        </Alert>
      ) : null}
      <AcceptInvitation token={token} onAccepted={(accepted) => navigate(homePathForRole(accepted.user.role), { replace: true })} />
    </AuthCard>
  );
}
