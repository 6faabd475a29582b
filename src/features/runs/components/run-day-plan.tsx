import { useId } from 'react';
import { useSearchParams } from 'react-router-dom';
import { addDays, isIsoDate, startOfWeek } from '../../../../shared/domain/business-calendar';
import { ErrorAlert } from '../../../components/ui/alert';
import { BranchSelect } from '../../../components/ui/branch-select';
import type { BranchOption } from '../../../components/ui/branch-select';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useBusinessToday } from '../../../lib/business-calendar';
import { useRunDay } from '../api/get-run-day';
import { formatDay, kg, plural } from '../lib/run-format';
import { RunCard } from './run-card';
import { RunWeekView } from './run-week-view';

type View = 'day' | 'week';

function DayRuns({ branchId, date }: { branchId: number; date: string }) {
  const day = useRunDay(branchId, date);
  if (!isIsoDate(date)) return <p role="alert">Choose a day.</p>;
  if (day.isPending) return <SkeletonBlock label="Loading the runs of the day" lines={6} />;
  if (day.isError) return <ErrorAlert error={day.error} title="The runs of the day could not be loaded" onRetry={() => void day.refetch()} />;
  if (day.data.length === 0) {
    return <EmptyState title={`No runs on ${formatDay(date)}`}>No lorry has a slot at this branch that day. Slots are made on the Lorries and slots page.</EmptyState>;
  }
  const pallets = day.data.reduce((n, r) => n + r.pallets, 0);
  const loaded = day.data.reduce((n, r) => n + r.loaded_count, 0);
  const weight = day.data.reduce((n, r) => n + r.weight_kg, 0);
  const drops = day.data.reduce((n, r) => n + r.drops.length, 0);
  return (
    <div className="space-y-3">
      <p className="text-sm text-ink-700">
        {plural(day.data.length, 'run')}, {plural(drops, 'drop')}, {kg(weight)} ·{' '}
        <span className="font-semibold tabular-nums">
          {loaded} of {pallets}
        </span>{' '}
        pallets loaded
      </p>
      <ul className="space-y-4" aria-label={`Runs on ${formatDay(date)}`}>
        {day.data.map((run) => (
          <RunCard key={run.id} run={run} />
        ))}
      </ul>
    </div>
  );
}

/**
 * The yard's day: every run of a branch on a day (its drops, deck, bars and pick list) and the week
 * around it. Branch, day and view live in the address, so a reload or a shared link shows the same.
 * On a desk the week sits beside the day; on a phone one shows at a time.
 */
export function RunDayPlan({ branches }: { branches: readonly BranchOption[] }) {
  const today = useBusinessToday();
  const dateId = useId();
  const [params, setParams] = useSearchParams();
  const asked = Number(params.get('branch'));
  const branchId = branches.some((b) => b.id === asked) ? asked : (branches[0]?.id ?? null);
  const date = params.get('date') ?? today;
  const view: View = params.get('view') === 'week' ? 'week' : 'day';
  const set = (changes: Record<string, string | null>) =>
    setParams(
      (current) => {
        const next = new URLSearchParams(current);
        for (const [k, v] of Object.entries(changes)) {
          if (v === null) next.delete(k);
          else next.set(k, v);
        }
        return next;
      },
      { replace: true },
    );
  const shift = (days: number) => isIsoDate(date) && set({ date: addDays(date, days) });

  if (branchId === null) return <EmptyState title="No branches yet">A branch and its lorries come first.</EmptyState>;
  const monday = startOfWeek(isIsoDate(date) ? date : today);
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <BranchSelect branches={branches} value={branchId} onChange={(id) => set({ branch: String(id) })} />
        <div className="flex flex-wrap items-end gap-2">
          <Button variant="secondary" onClick={() => shift(-1)} aria-label="Day before">
            ←<span className="hidden sm:inline"> Day before</span>
          </Button>
          <div>
            <label htmlFor={dateId} className="mb-1 block font-medium">
              Day
            </label>
            <input id={dateId} type="date" value={date} onChange={(e) => set({ date: e.target.value || null })} className="block min-h-tap rounded-md border border-ink-300 bg-white px-3" />
          </div>
          <Button variant="secondary" onClick={() => shift(1)} aria-label="Day after">
            <span className="hidden sm:inline">Day after </span>→
          </Button>
          {date !== today ? (
            <Button variant="ghost" onClick={() => set({ date: null })}>
              Today
            </Button>
          ) : null}
        </div>
      </div>
      <div className="flex gap-2 lg:hidden" role="group" aria-label="Show">
        {(['day', 'week'] as const).map((v) => (
          <Button key={v} variant={view === v ? 'primary' : 'secondary'} aria-pressed={view === v} onClick={() => set({ view: v === 'day' ? null : 'week' })} className="flex-1">
            {v === 'day' ? 'The day' : 'The week'}
          </Button>
        ))}
      </div>
      <div className="grid grid-cols-[minmax(0,1fr)] items-start gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(18rem,1fr)]">
        <section aria-label="Runs of the day" className={view === 'week' ? 'hidden lg:block' : ''}>
          <h2 className="mb-2 text-lg font-semibold">
            {formatDay(isIsoDate(date) ? date : today)}
            {date === today ? ' (today)' : ''}
          </h2>
          <DayRuns key={`${branchId}-${date}`} branchId={branchId} date={date} />
        </section>
        <div className={view === 'day' ? 'hidden lg:block' : ''}>
          <RunWeekView branchId={branchId} from={monday} selectedDate={date} today={today} onPickDay={(d) => set({ date: d, view: null })} onShiftWeek={(weeks) => set({ date: addDays(monday, weeks * 7) })} />
        </div>
      </div>
    </div>
  );
}
