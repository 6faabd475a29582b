import { useParams } from 'react-router-dom';
import { SectionBoundary } from '../../components/errors/section-boundary';
import { Alert } from '../../components/ui/alert';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { ProjectEstimates } from '../../features/estimates/components/project-estimates';
import { ProjectOrders } from '../../features/orders/components/project-orders';
import { useProject } from '../../features/projects/api/get-project';
import { ProjectAccessCard, ProjectActions, ProjectContactCard } from '../../features/projects/components/project-overview';
import { useCurrentSchedule } from '../../features/schedules/api/get-current-schedule';
import { CurrentSchedule } from '../../features/schedules/components/current-schedule';
import type { Project } from '../../../shared/schemas/project.schema';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

/** The site's contact card with the buildings its roof schedule names, once the schedule is loaded. */
function SiteContact({ site }: { site: Project }) {
  const schedule = useCurrentSchedule(site.id);
  return <ProjectContactCard project={site} scheduleBuildings={schedule.data?.faces.map((f) => f.building) ?? []} />;
}

export function SiteRoute() {
  const projectId = idParam(useParams(), 'projectId');
  const project = useProject(projectId);
  usePageTitle(project.data?.name ?? 'Site');
  return (
    <>
      <TextLink to="/sites">← Sites</TextLink>
      <PageQuery query={project} what="the site">
        {(site) => {
          const archived = site.archived_at !== null;
          return (
            <>
              <PageHeader title={site.name} lead={[site.reference, site.site_address].filter(Boolean).join(' · ')} actions={<ProjectActions project={site} />} />
              {archived ? (
                <Alert tone="info" className="mb-6" title="This site is archived" live={false}>
                  Its schedule, estimates and orders are kept; restore it to add to them.
                </Alert>
              ) : null}
              <div className="space-y-6">
                <div className="grid items-start gap-6 lg:grid-cols-2">
                  <SiteContact site={site} />
                  <ProjectAccessCard project={site} />
                </div>
                <SectionBoundary name="roof schedule">
                  <CurrentSchedule projectId={site.id} readOnly={archived} />
                </SectionBoundary>
                <SectionBoundary name="estimates">
                  <ProjectEstimates projectId={site.id} canEstimate={!archived && site.schedule !== null} />
                </SectionBoundary>
                <SectionBoundary name="orders">
                  <ProjectOrders projectId={site.id} />
                </SectionBoundary>
              </div>
            </>
          );
        }}
      </PageQuery>
    </>
  );
}
