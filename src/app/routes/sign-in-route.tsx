import { useQueryClient } from '@tanstack/react-query';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { rememberSession } from '../../features/auth/api/get-session';
import { homePathForRole, safeNextPath } from '../home-path';
import { SignInPage } from '../sign-in-page';

export function SignInRoute() {
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const [params] = useSearchParams();
  const next = safeNextPath(params.get('next'));

  return (
    <SignInPage
      next={next}
      onSignedIn={(session) => {
        rememberSession(queryClient, session);
        return navigate(next ?? homePathForRole(session.user.role), { replace: true });
      }}
    />
  );
}
