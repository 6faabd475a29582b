import { SectionBoundary } from '../../components/errors/section-boundary';
import { PageHeader } from '../../components/ui/page-header';
import { BranchList } from '../../features/organisation/components/branch-list';
import { OrganisationSummary } from '../../features/organisation/components/organisation-summary';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';

export function OrganisationRoute() {
  usePageTitle('Organisation');
  const { organisation } = useCurrentSession();
  return (
    <>
      <PageHeader title="Organisation" lead={organisation.name} />
      <div className="space-y-6">
        <SectionBoundary name="organisation">
          <OrganisationSummary title="Overview" />
        </SectionBoundary>
        {organisation.kind === 'merchant' ? (
          <SectionBoundary name="branches">
            <BranchList />
          </SectionBoundary>
        ) : null}
      </div>
    </>
  );
}
