import { useSyncExternalStore } from 'react';
import { BusinessCalendar, DEFAULT_BUSINESS_TIME_ZONE } from '../../shared/domain/business-calendar';

/**
 * The firm's calendar in the browser. The server names the time zone with the session; until then
 * (signed-out pages) the default zone applies. Every "today" on a page comes from here, never from the
 * browser's own zone or from UTC.
 */
let calendar = new BusinessCalendar(DEFAULT_BUSINESS_TIME_ZONE);
const listeners = new Set<() => void>();

/** Called with the session: the zone the server's calendar is kept in. */
export function setBusinessTimeZone(timeZone: string): void {
  if (timeZone === calendar.timeZone) return;
  try {
    calendar = new BusinessCalendar(timeZone);
  } catch {
    return; // a zone this browser does not know: keep the one we have
  }
  for (const l of listeners) l();
}

/** The calendar outside React (fetchers, schemas). */
export function businessCalendar(): BusinessCalendar {
  return calendar;
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** The calendar in a component; re-renders when the session names another zone. */
export function useBusinessCalendar(): BusinessCalendar {
  return useSyncExternalStore(subscribe, () => calendar);
}

/** Today's date (YYYY-MM-DD) in the firm's time zone. */
export function useBusinessToday(): string {
  return useBusinessCalendar().today();
}
