import { useQueryClient } from '@tanstack/react-query';
import { useNavigate, useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useToast } from '../../components/ui/toast';
import { projectKeys } from '../../features/projects/api/keys';
import { useCurrentSchedule } from '../../features/schedules/api/get-current-schedule';
import { FacesForm } from '../../features/schedules/components/faces-form';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function ScheduleEditRoute() {
  const projectId = idParam(useParams(), 'projectId');
  const schedule = useCurrentSchedule(projectId);
  const navigate = useNavigate();
  const toast = useToast();
  const queryClient = useQueryClient();
  usePageTitle('Roof faces');
  return (
    <>
      <TextLink to={`/sites/${projectId}`}>← The site</TextLink>
      <PageQuery query={schedule} what="the roof schedule">
        {(current) => (
          <>
            <PageHeader title="Roof faces" lead={current ? `Starting from version ${current.version}` : 'The first schedule of this site'} />
            <FacesForm
              projectId={projectId}
              initial={current?.faces ?? []}
              initialOpenings={current?.openings ?? []}
              onSaved={(saved) => {
                void queryClient.invalidateQueries({ queryKey: projectKeys.all });
                toast.show(`Version ${saved.version} stored: ${saved.faces.length} faces.`, 'success');
                navigate(`/sites/${projectId}`);
              }}
            />
          </>
        )}
      </PageQuery>
    </>
  );
}
