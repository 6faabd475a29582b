import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { AuthCard } from '../../components/layout/public-layout';
import { Alert } from '../../components/ui/alert';
import { buttonClasses } from '../../components/ui/button';
import { TextLink } from '../../components/ui/text-link';
import { ResetPasswordForm } from '../../features/auth/components/reset-password-form';
import { usePageTitle } from '../../lib/use-page-title';

export function ResetPasswordRoute() {
  usePageTitle('Choose a new password');
  const [params] = useSearchParams();
  const token = params.get('token');
  const [done, setDone] = useState(false);

  return (
    <AuthCard
      title="Choose a new password"
      after={
        done ? null : (
          <p>
            <TextLink to="/forgot-password">Link not working? Ask for a new one</TextLink>
          </p>
        )
      }
    >
      {done ? (
        <div className="space-y-5">
          <Alert tone="success" title="Password changed">
            Sign in with your new password. The link you used no longer works.
          </Alert>
          <Link to="/sign-in" className={buttonClasses('primary', 'lg', 'w-full')}>
            Sign in
          </Link>
        </div>
      ) : token ? (
        <ResetPasswordForm token={token} onDone={() => setDone(true)} />
      ) : (
        <Alert tone="danger" title="This link is incomplete">
          Open the link from the e-mail again, or <TextLink to="/forgot-password">ask for a new one</TextLink>.
        </Alert>
      )}
    </AuthCard>
  );
}
