import { Link } from 'react-router-dom';
import { buttonClasses } from '../../components/ui/button';
import { PageHeader } from '../../components/ui/page-header';
import { ProjectsList } from '../../features/projects/components/projects-list';
import { usePageTitle } from '../../lib/use-page-title';

export function SitesRoute() {
  usePageTitle('Sites');
  return (
    <>
      <PageHeader
        title="Sites"
        lead="Each site holds its roof schedule, estimates and orders."
        actions={
          <Link to="/sites/new" className={buttonClasses('primary')}>
            New site
          </Link>
        }
      />
      <ProjectsList />
    </>
  );
}
