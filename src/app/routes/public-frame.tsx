import { Outlet } from 'react-router-dom';
import { PublicLayout } from '../../components/layout/public-layout';
import { PublicNotices } from '../../components/layout/public-notices';
import { DevFooterLinks } from '../dev-footer-links';

export function PublicFrame() {
  return (
    <PublicLayout footerLinks={<DevFooterLinks />} notices={<PublicNotices />}>
      <Outlet />
    </PublicLayout>
  );
}
