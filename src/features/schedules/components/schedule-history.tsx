import { Link } from 'react-router-dom';
import type { ScheduleVersion } from '../../../../shared/schemas/schedule-upload.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDateTime } from '../../../lib/format';
import { useScheduleHistory } from '../api/get-schedule-history';

export function sourceWords(version: Pick<ScheduleVersion, 'source' | 'filename'>): string {
  if (version.source === 'csv') return version.filename ? `Imported from ${version.filename}` : 'Imported from a CSV file';
  return 'Entered or checked in Ridgeload';
}

/** Every version of a site's schedule, newest first; earlier ones are kept so old estimates reopen with their faces. */
export function ScheduleHistory({ projectId }: { projectId: number }) {
  const history = useScheduleHistory(projectId);
  if (history.isPending) return <SkeletonBlock label="Loading the schedule history" lines={3} />;
  if (history.isError) return <ErrorAlert error={history.error} title="The schedule history could not be loaded" onRetry={() => void history.refetch()} />;
  if (history.data.length === 0) return <EmptyState title="No versions yet" />;
  return (
    <ol className="divide-y divide-mortar-200" aria-label="Schedule versions, newest first">
      {history.data.map((version, i) => (
        <li key={version.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 py-2">
          <Link to={`/sites/${projectId}/schedules/${version.version}`} className="inline-flex min-h-tap items-center font-semibold text-clay-700 underline underline-offset-2">
            Version {version.version}
            {i === 0 ? ' (in use)' : ''}
          </Link>
          <span className="text-sm text-ink-600">
            {version.face_count} {version.face_count === 1 ? 'face' : 'faces'} · {sourceWords(version)} · {formatDateTime(version.created_at)}
            {version.created_by ? ` by ${version.created_by.name}` : ''}
          </span>
        </li>
      ))}
    </ol>
  );
}
