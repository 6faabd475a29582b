import type { SessionBody } from '../../shared/schemas/auth.schema';
import { AuthCard } from '../components/layout/public-layout';
import { InAppLink, TEXT_LINK_CLASS } from '../components/ui/in-app-link';
import { SignInForm } from '../features/auth/components/sign-in-form';
import { usePageTitle } from '../lib/use-page-title';

interface SignInPageProps {
  /** Where the person was heading, when a page sent them here. */
  next: string | null;
  onSignedIn: (session: SessionBody) => Promise<unknown> | unknown;
}

/**
 * The sign-in page's content, without the router: shown on its own when a phone opens /sign-in
 * (src/app/sign-in-start.tsx) and as the router's sign-in route once the app runs.
 */
export function SignInPage({ next, onSignedIn }: SignInPageProps) {
  usePageTitle('Sign in');
  return (
    <AuthCard
      title="Sign in"
      lead={next ? 'Sign in to carry on where you were.' : 'Welcome back to Ridgeload.'}
      after={
        <>
          <p>
            <InAppLink to="/forgot-password" className={TEXT_LINK_CLASS}>
              Forgotten your password?
            </InAppLink>
          </p>
          <p className="text-ink-700">
            New to Ridgeload?{' '}
            <InAppLink to="/sign-up" className={TEXT_LINK_CLASS}>
              Create an account for your firm
            </InAppLink>
          </p>
        </>
      }
    >
      <SignInForm onSignedIn={onSignedIn} />
    </AuthCard>
  );
}
