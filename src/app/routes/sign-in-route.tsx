import { useNavigate, useSearchParams } from 'react-router-dom';
import { AuthCard } from '../../components/layout/public-layout';
import { TextLink } from '../../components/ui/text-link';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { usePageTitle } from '../../lib/use-page-title';
import { homePathForRole, safeNextPath } from '../home-path';

export function SignInRoute() {
  usePageTitle('Sign in');
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const next = safeNextPath(params.get('next'));

  return (
    <AuthCard
      title="Sign in"
      lead={next ? 'Sign in to carry on where you were.' : 'Welcome back to Ridgeload.'}
      after={
        <>
          <p>
            <TextLink to="/forgot-password">Forgotten your password?</TextLink>
          </p>
          <p className="text-ink-700">
            New to Ridgeload? <TextLink to="/sign-up">Create an account for your firm</TextLink>
          </p>
        </>
      }
    >
      <SignInForm onSignedIn={(session) => navigate(next ?? homePathForRole(session.user.role), { replace: true })} />
    </AuthCard>
  );
}
