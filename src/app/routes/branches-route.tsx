import { SectionBoundary } from '../../components/errors/section-boundary';
import { PageHeader } from '../../components/ui/page-header';
import { BranchList } from '../../features/organisation/components/branch-list';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';

export function BranchesRoute() {
  usePageTitle('Branches');
  const { organisation } = useCurrentSession();
  return (
    <>
      <PageHeader title="Branches" lead={`The branches of ${organisation.name}.`} />
      <SectionBoundary name="branches">
        <BranchList title="All branches" />
      </SectionBoundary>
    </>
  );
}
