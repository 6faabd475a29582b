import type { SessionBody } from '../../../../shared/schemas/auth.schema';
import { setBusinessTimeZone } from '../../../lib/business-calendar';
import { setAppCurrency } from '../../../lib/format';

/** The firm-wide settings a session names, taken up before any page of the signed-in person shows: the calendar's zone and the currency. */
export function adoptSessionSettings(session: SessionBody | null): void {
  if (!session) return;
  setBusinessTimeZone(session.calendar.time_zone);
  setAppCurrency(session.currency);
}
