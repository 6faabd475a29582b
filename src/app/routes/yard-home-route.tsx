import { ROLE_LABELS } from '../../../shared/domain/roles';
import { SectionBoundary } from '../../components/errors/section-boundary';
import { ErrorAlert } from '../../components/ui/alert';
import { PageHeader } from '../../components/ui/page-header';
import { SkeletonBlock } from '../../components/ui/skeleton';
import { TextLink } from '../../components/ui/text-link';
import { useYardBranches } from '../../features/fleet/api/get-yard-branches';
import { RunDayPlan } from '../../features/runs/components/run-day-plan';
import { TeamSummary } from '../../features/team/components/team-summary';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';
import { homePathForRole } from '../home-path';
import { RoleHome } from './role-home';

function DayPlanSection() {
  const branches = useYardBranches();
  if (branches.isPending) return <SkeletonBlock label="Loading the branches" lines={3} />;
  if (branches.isError) return <ErrorAlert error={branches.error} title="The branches could not be loaded" onRetry={() => void branches.refetch()} />;
  return <RunDayPlan branches={branches.data} />;
}

/** The yard's home: the day plan of its lorries' runs. The merchant owner opens the same page from the navigation. */
export function YardHomeRoute() {
  usePageTitle('Yard and transport');
  const { user, organisation } = useCurrentSession();
  const page = (
    <>
      <PageHeader title="Yard and transport" lead={`${organisation.name} · ${user.name}, ${ROLE_LABELS[user.role]}`} actions={<TextLink to="/fleet">Lorries and slots</TextLink>} />
      <SectionBoundary name="day plan">
        <DayPlanSection />
      </SectionBoundary>
      {homePathForRole(user.role) === '/yard' ? (
        <div className="mt-8 max-w-xl">
          <SectionBoundary name="team">
            <TeamSummary footer={<TextLink to="/team">Open the team page</TextLink>} />
          </SectionBoundary>
        </div>
      ) : null}
    </>
  );
  return homePathForRole(user.role) === '/yard' ? <RoleHome role={user.role}>{page}</RoleHome> : page;
}
