import { NotFoundContent } from '../../components/errors/not-found-page';
import { PublicLayout } from '../../components/layout/public-layout';
import { PublicNotices } from '../../components/layout/public-notices';
import { usePageTitle } from '../../lib/use-page-title';
import { DevFooterLinks } from '../dev-footer-links';

export function NotFoundRoute() {
  usePageTitle('Page not found');
  return (
    <PublicLayout footerLinks={<DevFooterLinks />} notices={<PublicNotices />}>
      <NotFoundContent />
    </PublicLayout>
  );
}
