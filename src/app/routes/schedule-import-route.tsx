import { lazy, Suspense } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { useNavigate, useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { SkeletonBlock } from '../../components/ui/skeleton';
import { TextLink } from '../../components/ui/text-link';
import { useToast } from '../../components/ui/toast';
import { projectKeys } from '../../features/projects/api/keys';
import { useProject } from '../../features/projects/api/get-project';
import { ScheduleImport } from '../../features/schedules/components/schedule-import';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

// The column guide (a table, with the table library) sits below the file picker and loads after it (DEVELOPERS.md, decision 37).
const ColumnGuide = lazy(() => import('../../features/schedules/components/column-guide').then((m) => ({ default: m.ColumnGuide })));

export function ScheduleImportRoute() {
  const projectId = idParam(useParams(), 'projectId');
  const project = useProject(projectId);
  const navigate = useNavigate();
  const toast = useToast();
  const queryClient = useQueryClient();
  usePageTitle('Import a roof schedule');
  return (
    <>
      <TextLink to={`/sites/${projectId}`}>← The site</TextLink>
      <PageQuery query={project} what="the site">
        {(site) => (
          <>
            <PageHeader
              title="Import a roof schedule"
              lead={`${site.name}${site.schedule ? ` · now on version ${site.schedule.version}; the import becomes version ${site.schedule.version + 1} and the earlier ones are kept` : ''}`}
            />
            <div className="space-y-6">
              <ScheduleImport
                projectId={site.id}
                onImported={(schedule) => {
                  void queryClient.invalidateQueries({ queryKey: projectKeys.all });
                  toast.show(`Version ${schedule.version} stored: ${schedule.faces.length} faces.`, 'success');
                  navigate(`/sites/${site.id}`);
                }}
              />
              <Suspense fallback={<SkeletonBlock label="Loading the column guide" lines={4} />}>
                <ColumnGuide />
              </Suspense>
            </div>
          </>
        )}
      </PageQuery>
    </>
  );
}
