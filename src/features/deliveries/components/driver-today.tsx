import { useId, useState } from 'react';
import { ErrorAlert } from '../../../components/ui/alert';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useBusinessToday } from '../../../lib/business-calendar';
import { useOnline } from '../../../lib/use-online';
import { useDriverDay } from '../api/get-driver-day';
import { DriverDay } from './driver-day';
import type { RenderFaceDrawing } from './drop-parts';
import { OutboxPanel } from './outbox-panel';

const clock = new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit', day: 'numeric', month: 'short' });

interface DriverTodayProps {
  driverId: number;
  renderFaceDrawing?: RenderFaceDrawing;
}

/** The driver's home: what waits to send, then the day's runs (today in the firm's calendar unless another day is picked). */
export function DriverToday({ driverId, renderFaceDrawing }: DriverTodayProps) {
  const dateId = useId();
  const today = useBusinessToday();
  const [picked, setPicked] = useState<string | null>(null);
  const date = picked ?? today;
  const day = useDriverDay(driverId, date);
  const online = useOnline();
  const fromCopy = day.data && (day.isError || !online);

  return (
    <div className="space-y-6">
      <OutboxPanel />
      <div>
        <label htmlFor={dateId} className="mb-1.5 block text-xl font-semibold">
          Day
        </label>
        <input id={dateId} type="date" value={date} onChange={(e) => setPicked(e.target.value || null)} className="block min-h-tap-lg w-full rounded-md border-2 border-ink-300 bg-white px-4 text-xl" />
        {date !== today ? (
          <button type="button" className="mt-2 min-h-tap-lg text-lg font-semibold text-clay-700 underline" onClick={() => setPicked(null)}>
            Back to today
          </button>
        ) : null}
      </div>
      {fromCopy ? (
        <p role="status" className="rounded-md bg-ink-100 p-3 text-lg">
          No signal: showing the copy kept on this phone from {clock.format(day.dataUpdatedAt)}.
        </p>
      ) : null}
      {day.data ? (
        <DriverDay key={`${driverId}:${date}`} day={day.data} renderFaceDrawing={renderFaceDrawing} />
      ) : day.isError ? (
        <ErrorAlert error={day.error} title={online ? 'Your day could not be loaded' : 'No signal, and no copy of this day on the phone'} onRetry={() => void day.refetch()} />
      ) : (
        <SkeletonBlock label="Loading your day" lines={6} />
      )}
    </div>
  );
}
