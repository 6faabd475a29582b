import { InAppLink } from '../components/ui/in-app-link';
import { useOutboxAvailable } from '../features/outbox/api/outbox-available';

/**
 * The outbox link, outside production only. A development build always shows it; a built
 * client shows it when the server answers for the outbox (npm start runs the mail fake).
 */
export function DevFooterLinks() {
  const available = useOutboxAvailable();
  if (import.meta.env.PROD && !available) return null;
  return (
    <InAppLink to="/outbox" className="inline-flex min-h-tap items-center font-medium text-ink-700 underline underline-offset-2">
      Outbox (mail sent by this server)
    </InAppLink>
  );
}
