import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { ErrorAlert } from '../../../components/ui/alert';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useRunWeek } from '../api/get-run-week';
import { formatDay, kg, plural } from '../lib/run-format';
import { RunStatusBadge } from './run-status';
import { runPath } from './run-card';

interface RunWeekViewProps {
  branchId: number;
  /** Monday of the week shown. */
  from: string;
  /** The day the day view shows, marked here. */
  selectedDate: string;
  today: string;
  onPickDay: (date: string) => void;
  onShiftWeek: (weeks: number) => void;
}

/** A branch's runs over a week: a line per run (lorry, driver, drops, weight, pallets loaded), each opening its run. */
export function RunWeekView({ branchId, from, selectedDate, today, onPickDay, onShiftWeek }: RunWeekViewProps) {
  const week = useRunWeek(branchId, from);
  return (
    <section aria-label="Week of runs" className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 className="text-lg font-semibold">Week from {formatDay(from, false)}</h2>
        <div className="flex gap-2">
          <Button variant="secondary" onClick={() => onShiftWeek(-1)}>
            Week before
          </Button>
          <Button variant="secondary" onClick={() => onShiftWeek(1)}>
            Week after
          </Button>
        </div>
      </div>
      {week.isPending ? (
        <SkeletonBlock label="Loading the week" lines={5} />
      ) : week.isError ? (
        <ErrorAlert error={week.error} title="The week could not be loaded" onRetry={() => void week.refetch()} />
      ) : (
        <ol className="space-y-2">
          {week.data.days.map((day) => {
            const selected = day.date === selectedDate;
            const runs = day.runs;
            return (
              <li key={day.date} className={`rounded-md border bg-white p-2 ${selected ? 'border-clay-600 ring-1 ring-clay-600' : 'border-mortar-300'}`} aria-label={formatDay(day.date)} data-testid="week-day">
                <div className="flex flex-wrap items-center justify-between gap-2">
                  <button
                    type="button"
                    className="min-h-tap rounded-md px-2 text-left font-semibold text-clay-700 underline underline-offset-2 hover:bg-clay-50"
                    aria-pressed={selected}
                    aria-label={`Show the day plan of ${formatDay(day.date)}`}
                    onClick={() => onPickDay(day.date)}
                  >
                    {formatDay(day.date, false)}
                    {day.date === today ? <span className="ml-2 rounded bg-clay-600 px-1.5 text-xs font-semibold text-white no-underline">today</span> : null}
                  </button>
                  <span className="text-sm text-ink-600">{runs.length === 0 ? 'no runs' : plural(runs.length, 'run')}</span>
                </div>
                {runs.length > 0 ? (
                  <ul className="mt-1 divide-y divide-mortar-200">
                    {runs.map((run) => (
                      <li key={run.id} className="flex flex-wrap items-center justify-between gap-x-3 gap-y-1 px-2 py-1.5 text-sm">
                        <span className="min-w-0">
                          <Link to={runPath(run.id)} className="font-semibold text-clay-700 underline underline-offset-2">
                            {run.time_window} · {run.lorry.registration}
                          </Link>
                          {run.lorry.has_crane ? ' (crane)' : ''} · {run.driver?.name ?? 'no driver yet'}
                          <span className="block text-ink-700 tabular-nums">
                            {plural(run.drops, 'drop')} · {kg(run.weight_kg)} · {run.loaded_count} of {plural(run.pallets, 'pallet')} loaded
                          </span>
                        </span>
                        <RunStatusBadge status={run.status} />
                      </li>
                    ))}
                  </ul>
                ) : null}
              </li>
            );
          })}
        </ol>
      )}
    </section>
  );
}
