import { Link, Outlet, ScrollRestoration } from 'react-router-dom';
import { InAppLinkProvider } from '../../components/ui/in-app-link';
import type { RenderInAppLink } from '../../components/ui/in-app-link';

const routerLink: RenderInAppLink = ({ to, className, children }) => (
  <Link to={to} className={className}>
    {children}
  </Link>
);

export function RootLayout() {
  return (
    <InAppLinkProvider value={routerLink}>
      <Outlet />
      <ScrollRestoration />
    </InAppLinkProvider>
  );
}
