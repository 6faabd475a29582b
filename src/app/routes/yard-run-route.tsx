import { useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useRun } from '../../features/runs/api/get-run';
import { RunDetail } from '../../features/runs/components/run-detail';
import { orderHrefFor, runAbilitiesFor } from '../../features/runs/lib/run-abilities';
import { formatDay } from '../../features/runs/lib/run-format';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

/** One run (a slot's id): its drops in order, its deck pallet by pallet, its paperwork and sending it out. */
export function YardRunRoute() {
  const runId = idParam(useParams(), 'runId');
  const run = useRun(runId);
  const { user } = useCurrentSession();
  usePageTitle(run.data ? `${run.data.lorry.registration} ${run.data.date} ${run.data.time_window}` : 'Run');
  return (
    <>
      <TextLink to={run.data ? `/yard?branch=${run.data.branch_id}&date=${run.data.date}` : '/yard'}>← Day plan</TextLink>
      <PageQuery query={run} what="the run">
        {(found) => (
          <>
            <PageHeader title={`${found.lorry.registration} · ${found.time_window}`} lead={`${formatDay(found.date)} · run ${found.id}`} />
            <RunDetail run={found} can={runAbilitiesFor(user.role)} orderHref={orderHrefFor(user.role)} />
          </>
        )}
      </PageQuery>
    </>
  );
}
