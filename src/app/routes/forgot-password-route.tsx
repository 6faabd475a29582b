import { AuthCard } from '../../components/layout/public-layout';
import { TextLink } from '../../components/ui/text-link';
import { ForgotPasswordForm } from '../../features/auth/components/forgot-password-form';
import { usePageTitle } from '../../lib/use-page-title';

export function ForgotPasswordRoute() {
  usePageTitle('Forgotten password');
  return (
    <AuthCard
      title="Forgotten password"
      lead="Enter the e-mail address you sign in with and we will send a link to choose a new password."
      after={
        <p>
          <TextLink to="/sign-in">Back to sign in</TextLink>
        </p>
      }
    >
      <ForgotPasswordForm />
    </AuthCard>
  );
}
