/**
 * The firm's one calendar. Every "today", slot day and due date on the server and in the browser
 * comes from here, in one time zone (the setting BUSINESS_TIME_ZONE), so a desk in one place and a
 * server clock in UTC agree on which day it is. Days travel as ISO dates (YYYY-MM-DD).
 */

export const DEFAULT_BUSINESS_TIME_ZONE = 'Europe/London';

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const DAY_MS = 86_400_000;

/** True when the runtime knows the IANA time-zone name (e.g. "Europe/London"). */
export function isValidTimeZone(timeZone: string): boolean {
  if (!timeZone) return false;
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone });
    return true;
  } catch {
    return false;
  }
}

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' });
    formatters.set(timeZone, f);
  }
  return f;
}

/** The calendar day an instant falls on in the time zone, as YYYY-MM-DD. */
export function dateInZone(instant: Date, timeZone: string): string {
  const parts = formatterFor(timeZone).formatToParts(instant);
  const get = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${get('year')}-${get('month')}-${get('day')}`;
}

/** True for a real calendar date written YYYY-MM-DD (no 31 June, no 29 February outside leap years). */
export function isIsoDate(value: string): boolean {
  const m = ISO_DATE.exec(value);
  if (!m) return false;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return d.getUTCFullYear() === Number(m[1]) && d.getUTCMonth() === Number(m[2]) - 1 && d.getUTCDate() === Number(m[3]);
}

function toUtcMs(date: string): number {
  if (!isIsoDate(date)) throw new RangeError(`Not a calendar date: ${date}`);
  return Date.parse(`${date}T00:00:00Z`);
}

/** The date n days after (n < 0: before) an ISO date. Pure date arithmetic: no time zone involved. */
export function addDays(date: string, n: number): string {
  return new Date(toUtcMs(date) + n * DAY_MS).toISOString().slice(0, 10);
}

/** Whole days from a to b (b later: positive). */
export function daysBetween(a: string, b: string): number {
  return Math.round((toUtcMs(b) - toUtcMs(a)) / DAY_MS);
}

/** 0 = Sunday … 6 = Saturday. */
export function dayOfWeek(date: string): number {
  return new Date(toUtcMs(date)).getUTCDay();
}

/** Monday to Friday; deliveries and slots are booked on working days. */
export function isWorkingDay(date: string): boolean {
  const d = dayOfWeek(date);
  return d !== 0 && d !== 6;
}

/** The first working day after the date. */
export function nextWorkingDay(date: string): string {
  let d = addDays(date, 1);
  while (!isWorkingDay(d)) d = addDays(d, 1);
  return d;
}

/** The date a number of calendar months later, clamped to the month's last day (31 Jan + 1 → 28/29 Feb). */
export function addMonths(date: string, months: number): string {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  const first = new Date(Date.UTC(y, m - 1 + months, 1));
  const last = new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth() + 1, 0)).getUTCDate();
  return new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth(), Math.min(d, last))).toISOString().slice(0, 10);
}

/** Monday of the week the date is in. */
export function startOfWeek(date: string): string {
  const dow = dayOfWeek(date);
  return addDays(date, dow === 0 ? -6 : 1 - dow);
}

/** The firm's calendar: one time zone and a clock (replaceable in tests). */
export class BusinessCalendar {
  constructor(
    readonly timeZone: string = DEFAULT_BUSINESS_TIME_ZONE,
    private readonly clock: () => Date = () => new Date(),
  ) {
    if (!isValidTimeZone(timeZone)) throw new RangeError(`Unknown time zone: ${timeZone}`);
  }

  /** The current instant. */
  now(): Date {
    return this.clock();
  }

  /** Today's date in the firm's time zone. */
  today(): string {
    return dateInZone(this.clock(), this.timeZone);
  }

  /** Today plus n days. */
  fromToday(n: number): string {
    return addDays(this.today(), n);
  }

  isToday(date: string): boolean {
    return date === this.today();
  }

  isPast(date: string): boolean {
    return date < this.today();
  }

  /** The date an instant (an ISO timestamp) falls on in the firm's time zone. */
  dateOf(instant: string | Date): string {
    return dateInZone(typeof instant === 'string' ? new Date(instant) : instant, this.timeZone);
  }
}
