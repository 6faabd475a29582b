import { Outlet } from 'react-router-dom';
import { PublicLayout } from '../../components/layout/public-layout';
import { DevFooterLinks } from '../dev-footer-links';

export function PublicFrame() {
  return (
    <PublicLayout footerLinks={<DevFooterLinks />}>
      <Outlet />
    </PublicLayout>
  );
}
