import { useParams } from 'react-router-dom';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useScheduleVersion } from '../../features/schedules/api/get-schedule-version';
import { ScheduleFacesTable } from '../../features/schedules/components/schedule-faces-table';
import { ScheduleHistory, sourceWords } from '../../features/schedules/components/schedule-history';
import { formatDateTime } from '../../lib/format';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function ScheduleVersionRoute() {
  const params = useParams();
  const projectId = idParam(params, 'projectId');
  const version = idParam(params, 'version');
  const schedule = useScheduleVersion(projectId, version);
  usePageTitle(`Schedule version ${version}`);
  return (
    <>
      <TextLink to={`/sites/${projectId}`}>← The site</TextLink>
      <PageQuery query={schedule} what="this schedule version">
        {(stored) => (
          <>
            <PageHeader title={`Roof schedule, version ${stored.version}`} lead={`${sourceWords(stored)} · ${formatDateTime(stored.created_at)}${stored.created_by ? ` by ${stored.created_by.name}` : ''}`} />
            <div className="space-y-6">
              <Card title={`${stored.faces.length} faces`}>
                <ScheduleFacesTable faces={stored.faces} />
              </Card>
              <Card title="Every version">
                <ScheduleHistory projectId={projectId} />
              </Card>
            </div>
          </>
        )}
      </PageQuery>
    </>
  );
}
