import { useMemo } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { EmptyState } from '../../components/ui/empty-state';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useToast } from '../../components/ui/toast';
import { EstimateBuilder } from '../../features/estimates/components/estimate-builder';
import { useCurrentSchedule } from '../../features/schedules/api/get-current-schedule';
import { usePageTitle } from '../../lib/use-page-title';
import { engineFaces, engineOpenings } from './engine-faces';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function NewEstimateRoute() {
  const projectId = idParam(useParams(), 'projectId');
  const schedule = useCurrentSchedule(projectId);
  const faces = useMemo(() => engineFaces(schedule.data?.faces ?? []), [schedule.data]);
  const openings = useMemo(() => engineOpenings(schedule.data?.openings ?? []), [schedule.data]);
  const navigate = useNavigate();
  const toast = useToast();
  usePageTitle('New estimate');
  return (
    <>
      <TextLink to={`/sites/${projectId}`}>← The site</TextLink>
      <PageHeader title="New estimate" lead="Choose the roof system; the figures follow as you go." />
      <PageQuery query={schedule} what="the roof schedule">
        {(current) =>
          current ? (
            <EstimateBuilder
              projectId={projectId}
              faces={faces}
              openings={openings}
              scheduleVersion={current.version}
              onCreated={(estimate) => {
                toast.show(`Estimate ${estimate.id} saved.`, 'success');
                navigate(`/estimates/${estimate.id}`);
              }}
            />
          ) : (
            <EmptyState title="This site has no roof schedule yet" action={<TextLink to={`/sites/${projectId}/schedule/import`}>Import one</TextLink>} />
          )
        }
      </PageQuery>
    </>
  );
}
