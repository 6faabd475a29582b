import { ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useOrganisation } from '../api/get-organisation';

interface BranchListProps {
  title?: string;
  /** Large type and full-width call targets, for a phone in a yard. */
  large?: boolean;
}

export function BranchList({ title = 'Branches', large = false }: BranchListProps) {
  const organisation = useOrganisation();
  const branches = organisation.data?.branches ?? [];
  return (
    <Card title={title}>
      {organisation.isPending ? (
        <SkeletonBlock label="Loading the branches" lines={3} />
      ) : organisation.isError ? (
        <ErrorAlert error={organisation.error} title="The branches could not be loaded" onRetry={() => void organisation.refetch()} />
      ) : branches.length === 0 ? (
        <EmptyState title="No branches">{organisation.data.kind === 'contractor' ? 'Branches belong to merchants; a contractor firm has none.' : 'This merchant has no branches recorded yet.'}</EmptyState>
      ) : (
        <ul className={large ? 'space-y-4' : 'grid gap-3 sm:grid-cols-2'}>
          {branches.map((branch) => (
            <li key={branch.id} className="rounded-md border border-mortar-300 bg-mortar-50 p-4">
              <h3 className={large ? 'text-xl font-semibold' : 'font-semibold'}>{branch.name}</h3>
              <p className={large ? 'mt-1 text-lg text-ink-700' : 'mt-1 text-ink-700'}>
                {branch.address}
                <br />
                {branch.town}
              </p>
              {branch.phone ? (
                <a
                  href={`tel:${branch.phone.replace(/[^\d+]/g, '')}`}
                  aria-label={`Call ${branch.name} on ${branch.phone}`}
                  className={
                    large
                      ? 'mt-3 flex min-h-tap-lg items-center justify-center rounded-md border border-ink-300 bg-white text-lg font-semibold text-ink-900'
                      : 'mt-2 inline-flex min-h-tap items-center font-medium text-clay-700 underline underline-offset-2'
                  }
                >
                  {branch.phone}
                </a>
              ) : null}
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
