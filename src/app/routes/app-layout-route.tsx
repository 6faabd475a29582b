import { Navigate, Outlet, useNavigate } from 'react-router-dom';
import { ROLE_LABELS } from '../../../shared/domain/roles';
import { AppShell } from '../../components/layout/app-shell';
import { errorMessage } from '../../components/ui/alert';
import { useToast } from '../../components/ui/toast';
import { useSession } from '../../features/auth/api/get-session';
import { useSignOut } from '../../features/auth/api/sign-out';
import { DevFooterLinks } from '../dev-footer-links';
import { homePathForRole } from '../home-path';
import { navItemsForRole } from '../navigation';

/** The signed-in frame: shell, role-aware navigation, sign-out. */
export function AppLayoutRoute() {
  const session = useSession();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const toast = useToast();

  if (!session.data) return <Navigate to="/sign-in" replace />;
  const { user, organisation } = session.data;

  return (
    <AppShell
      navItems={navItemsForRole(user.role)}
      homePath={homePathForRole(user.role)}
      person={{ name: user.name, roleLabel: ROLE_LABELS[user.role], organisationName: organisation.name }}
      signingOut={signOut.isPending}
      onSignOut={() =>
        signOut.mutate(undefined, {
          onSuccess: () => navigate('/sign-in', { replace: true }),
          onError: (error) => toast.show(`Signing out did not work: ${errorMessage(error)}`, 'danger'),
        })
      }
      footerLinks={<DevFooterLinks />}
    >
      <Outlet />
    </AppShell>
  );
}
