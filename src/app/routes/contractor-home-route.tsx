import { ROLE_LABELS } from '../../../shared/domain/roles';
import { SectionBoundary } from '../../components/errors/section-boundary';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { OrganisationSummary } from '../../features/organisation/components/organisation-summary';
import { TeamSummary } from '../../features/team/components/team-summary';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';
import { RoleHome } from './role-home';

export function ContractorHomeRoute() {
  usePageTitle('Estimating');
  const { user, organisation } = useCurrentSession();
  return (
    <RoleHome role={user.role}>
      <PageHeader title="Estimating" lead={`${organisation.name} · ${user.name}, ${ROLE_LABELS[user.role]}`} />
      <div className="grid items-start gap-6 lg:grid-cols-2">
        <SectionBoundary name="organisation">
          <OrganisationSummary title="Your firm" />
        </SectionBoundary>
        <SectionBoundary name="team">
          <TeamSummary footer={<TextLink to="/team">Open the team page</TextLink>} />
        </SectionBoundary>
      </div>
    </RoleHome>
  );
}
