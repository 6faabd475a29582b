import { useNavigate } from 'react-router-dom';
import { AuthCard } from '../../components/layout/public-layout';
import { TextLink } from '../../components/ui/text-link';
import { SignUpForm } from '../../features/auth/components/sign-up-form';
import { usePageTitle } from '../../lib/use-page-title';
import { homePathForRole } from '../home-path';

export function SignUpRoute() {
  usePageTitle('Create an account');
  const navigate = useNavigate();
  return (
    <AuthCard
      title="Create an account"
      lead="Set up your firm on Ridgeload. You become its owner and can invite the rest of your team afterwards."
      after={
        <p className="text-ink-700">
          Already have an account? <TextLink to="/sign-in">Sign in</TextLink>
        </p>
      }
    >
      <SignUpForm onSignedUp={(session) => navigate(homePathForRole(session.user.role), { replace: true })} />
    </AuthCard>
  );
}
