import { addMonths, type BusinessCalendar } from './business-calendar';

/** How far ahead a delivery day may be asked for or offered: a job booked further out is a typing slip. */
export const BOOKING_HORIZON_MONTHS = 24;

/** The first and last day a delivery may be asked for, by the firm's calendar. */
export function bookingWindow(calendar: BusinessCalendar): { first: string; last: string } {
  const first = calendar.today();
  return { first, last: addMonths(first, BOOKING_HORIZON_MONTHS) };
}

/** Why a delivery day cannot be booked, in words for the field, or null when it can. */
export function bookingDateProblem(calendar: BusinessCalendar, date: string): string | null {
  const { first, last } = bookingWindow(calendar);
  if (date < first) return 'must be today or later';
  if (date > last) return `must be within two years, by ${last} at the latest`;
  return null;
}
