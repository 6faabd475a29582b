import { Link } from 'react-router-dom';
import { ROLE_LABELS } from '../../../shared/domain/roles';
import { SectionBoundary } from '../../components/errors/section-boundary';
import { buttonClasses } from '../../components/ui/button';
import { PageHeader } from '../../components/ui/page-header';
import { OpenOrders } from '../../features/orders/components/open-orders';
import { RecentProjects } from '../../features/projects/components/recent-projects';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';
import { RoleHome } from './role-home';

/** The estimator's day: the sites in hand and the orders on their way. */
export function ContractorHomeRoute() {
  usePageTitle('Estimating');
  const { user, organisation } = useCurrentSession();
  return (
    <RoleHome role={user.role}>
      <PageHeader
        title="Estimating"
        lead={`${organisation.name} · ${user.name}, ${ROLE_LABELS[user.role]}`}
        actions={
          <div className="flex flex-wrap gap-2">
            <Link to="/sites/new" className={buttonClasses('primary')}>
              New site
            </Link>
            <Link to="/quotes" className={buttonClasses('secondary')}>
              Quote requests
            </Link>
          </div>
        }
      />
      <div className="grid items-start gap-6 lg:grid-cols-2">
        <SectionBoundary name="recent sites">
          <RecentProjects />
        </SectionBoundary>
        <SectionBoundary name="open orders">
          <OpenOrders />
        </SectionBoundary>
      </div>
    </RoleHome>
  );
}
