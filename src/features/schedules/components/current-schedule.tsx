import { lazy, Suspense } from 'react';
import { Link } from 'react-router-dom';
import { ErrorAlert } from '../../../components/ui/alert';
import { buttonClasses } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDateTime } from '../../../lib/format';
import { useCurrentSchedule } from '../api/get-current-schedule';
import { ScheduleFacesTable, ScheduleOpeningsTable } from './schedule-faces-table';
import { ScheduleHistory, sourceWords } from './schedule-history';

/** Adding openings from a file: the file readers (CSV, the schedule's checks) load when it shows, after the schedule. */
const OpeningsImport = lazy(() => import('./openings-import').then((m) => ({ default: m.OpeningsImport })));

interface CurrentScheduleProps {
  projectId: number;
  /** An archived site takes no new versions. */
  readOnly: boolean;
}

/** The schedule in use on a site, with the ways to replace it and its earlier versions. */
export function CurrentSchedule({ projectId, readOnly }: CurrentScheduleProps) {
  const schedule = useCurrentSchedule(projectId);
  const actions = readOnly ? null : (
    <div className="flex flex-wrap gap-2">
      <Link to={`/sites/${projectId}/schedule/import`} className={buttonClasses(schedule.data ? 'secondary' : 'primary')}>
        {schedule.data ? 'Import a new version' : 'Import a schedule'}
      </Link>
      <Link to={`/sites/${projectId}/schedule/edit`} className={buttonClasses('secondary')}>
        {schedule.data ? 'Edit the faces' : 'Enter faces by hand'}
      </Link>
    </div>
  );
  return (
    <Card title="Roof schedule" actions={actions}>
      {schedule.isPending ? (
        <SkeletonBlock label="Loading the roof schedule" lines={4} />
      ) : schedule.isError ? (
        <ErrorAlert error={schedule.error} title="The roof schedule could not be loaded" onRetry={() => void schedule.refetch()} />
      ) : !schedule.data ? (
        <EmptyState title="No roof schedule yet">Import a CSV with one row per roof face, or enter the faces by hand.</EmptyState>
      ) : (
        <div className="space-y-4">
          <p className="text-sm text-ink-700">
            Version {schedule.data.version} · {schedule.data.faces.length} {schedule.data.faces.length === 1 ? 'face' : 'faces'} · {sourceWords(schedule.data)} · {formatDateTime(schedule.data.created_at)}
          </p>
          <ScheduleFacesTable faces={schedule.data.faces} />
          {schedule.data.faces.some((f) => f.top_assumed) ? (
            <p className="text-sm font-medium text-brick-700">Some faces beside a hip or valley were stored without a top edge: their top was taken as the eaves. Edit the faces to give it.</p>
          ) : null}
          <section aria-label="Openings" className="space-y-2">
            <h3 className="font-semibold">Openings {schedule.data.openings.length > 0 ? `(${schedule.data.openings.length})` : ''}</h3>
            {schedule.data.openings.length > 0 ? <ScheduleOpeningsTable openings={schedule.data.openings} /> : <p className="text-sm text-ink-700">No roof windows, chimneys, dormers or hatches recorded.</p>}
            {readOnly ? null : (
              <Suspense fallback={<p className="text-sm text-ink-600">Loading the openings import…</p>}>
                <OpeningsImport projectId={projectId} />
              </Suspense>
            )}
          </section>
          <details className="rounded-md border border-mortar-300 px-4 py-2">
            <summary className="min-h-tap cursor-pointer content-center font-semibold">Earlier versions</summary>
            <ScheduleHistory projectId={projectId} />
          </details>
        </div>
      )}
    </Card>
  );
}
