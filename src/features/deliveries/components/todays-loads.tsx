import { businessCalendar } from '../../../lib/business-calendar';
import { useId, useState } from 'react';
import { ErrorAlert } from '../../../components/ui/alert';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useLoadingSheet } from '../api/get-loading-sheet';
import { LoadingSheet } from './loading-sheet';


/** The driver's loads for a day, today first. */
export function TodaysLoads() {
  const dateId = useId();
  const [date, setDate] = useState(() => businessCalendar().today());
  const sheet = useLoadingSheet(date);
  return (
    <section aria-label="Your loads" className="space-y-4">
      <div>
        <label htmlFor={dateId} className="mb-1.5 block text-xl font-semibold">
          Day
        </label>
        <input id={dateId} type="date" value={date} onChange={(e) => setDate(e.target.value)} className="block min-h-tap-lg w-full rounded-md border-2 border-ink-300 bg-white px-4 text-xl sm:w-72" />
      </div>
      {sheet.isPending && sheet.fetchStatus !== 'idle' ? (
        <SkeletonBlock label="Loading your loads" lines={6} />
      ) : sheet.isError ? (
        <ErrorAlert error={sheet.error} title="Your loads could not be loaded" onRetry={() => void sheet.refetch()} />
      ) : sheet.data ? (
        <LoadingSheet sheet={sheet.data} />
      ) : null}
    </section>
  );
}
