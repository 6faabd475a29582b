import type { QueryClient } from '@tanstack/react-query';
import type { SessionBody } from '../../../../shared/schemas/auth.schema';
import { setBusinessTimeZone } from '../../../lib/business-calendar';
import { setAppCurrency } from '../../../lib/format';
import { authKeys } from './keys';

/** The firm-wide settings a session names, taken up before any page of the signed-in person shows: the calendar's zone and the currency. */
export function adoptSessionSettings(session: SessionBody | null): void {
  if (!session) return;
  setBusinessTimeZone(session.calendar.time_zone);
  setAppCurrency(session.currency);
}

/** Someone has just signed in (or signed up, or joined a firm): nothing cached for a previous person may leak into this one's pages. */
export function startSession(queryClient: QueryClient, session: SessionBody): void {
  adoptSessionSettings(session);
  queryClient.removeQueries();
  queryClient.setQueryData(authKeys.session(), session);
}
