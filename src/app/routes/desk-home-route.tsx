import { can } from '../../../shared/domain/policy';
import { ROLE_LABELS } from '../../../shared/domain/roles';
import { SectionBoundary } from '../../components/errors/section-boundary';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { WaitingOrders } from '../../features/desk/components/waiting-orders';
import { BranchList } from '../../features/organisation/components/branch-list';
import { OrganisationSummary } from '../../features/organisation/components/organisation-summary';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';
import { RoleHome } from './role-home';

export function DeskHomeRoute() {
  usePageTitle('Order desk');
  const { user, organisation } = useCurrentSession();
  return (
    <RoleHome role={user.role}>
      <PageHeader title="Order desk" lead={`${organisation.name} · ${user.name}, ${ROLE_LABELS[user.role]}`} />
      <SectionBoundary name="waiting orders">
        <WaitingOrders />
      </SectionBoundary>
      <div className="mt-6 grid items-start gap-6 lg:grid-cols-[1fr_2fr]">
        <SectionBoundary name="organisation">
          <OrganisationSummary title="Your business" footer={can(user.role, 'members:read') ? <TextLink to="/team">Open the team page</TextLink> : null} />
        </SectionBoundary>
        <SectionBoundary name="branches">
          <BranchList />
        </SectionBoundary>
      </div>
    </RoleHome>
  );
}
