import { can } from '../../../shared/domain/policy';
import { ROLE_LABELS } from '../../../shared/domain/roles';
import { SectionBoundary } from '../../components/errors/section-boundary';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { YardBoard } from '../../features/fleet/components/yard-board';
import { BranchList } from '../../features/organisation/components/branch-list';
import { TeamSummary } from '../../features/team/components/team-summary';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';
import { RoleHome } from './role-home';

export function YardHomeRoute() {
  usePageTitle('Yard and transport');
  const { user, organisation } = useCurrentSession();
  return (
    <RoleHome role={user.role}>
      <PageHeader title="Yard and transport" lead={`${organisation.name} · ${user.name}, ${ROLE_LABELS[user.role]}`} />
      <SectionBoundary name="slots and lorries">
        <YardBoard canManage={can(user.role, 'fleet:manage')} />
      </SectionBoundary>
      <div className="mt-8 grid items-start gap-6 lg:grid-cols-[2fr_1fr]">
        <SectionBoundary name="branches">
          <BranchList title="Branches and yards" />
        </SectionBoundary>
        <SectionBoundary name="team">
          <TeamSummary footer={<TextLink to="/team">Open the team page</TextLink>} />
        </SectionBoundary>
      </div>
    </RoleHome>
  );
}
