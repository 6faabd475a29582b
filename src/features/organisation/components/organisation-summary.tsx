import type { ReactNode } from 'react';
import { ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useOrganisation } from '../api/get-organisation';

const kindWords = { contractor: 'Roofing contractor', merchant: 'Tile merchant' } as const;

interface OrganisationSummaryProps {
  title?: string;
  footer?: ReactNode;
}

/** The firm's name and kind, and for a merchant how many branches it runs. */
export function OrganisationSummary({ title = 'Organisation', footer }: OrganisationSummaryProps) {
  const organisation = useOrganisation();
  return (
    <Card title={title}>
      {organisation.isPending ? (
        <SkeletonBlock label="Loading the organisation" lines={2} />
      ) : organisation.isError ? (
        <ErrorAlert error={organisation.error} title="The organisation could not be loaded" onRetry={() => void organisation.refetch()} />
      ) : (
        <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-2">
          <dt className="text-sm font-medium text-ink-600">Name</dt>
          <dd className="font-semibold">{organisation.data.name}</dd>
          <dt className="text-sm font-medium text-ink-600">Kind</dt>
          <dd>{kindWords[organisation.data.kind]}</dd>
          {organisation.data.kind === 'merchant' ? (
            <>
              <dt className="text-sm font-medium text-ink-600">Branches</dt>
              <dd>{organisation.data.branches.length}</dd>
            </>
          ) : null}
        </dl>
      )}
      {footer ? <div className="mt-4">{footer}</div> : null}
    </Card>
  );
}
