import type { BusinessCalendar } from '../../shared/domain/business-calendar';

/** The query text of a request's URL (after `?`), '' when there is none. */
export function rawQuery(url: string): string {
  const at = url.indexOf('?');
  return at === -1 ? '' : url.slice(at + 1);
}

/**
 * The business day as the calendar gives it, worked out at most once per clock minute: every time
 * zone's offset is a whole number of minutes, so a day never starts inside a minute.
 */
export function businessDay(calendar: BusinessCalendar): () => string {
  let minute = Number.NaN;
  let day = '';
  return () => {
    const now = calendar.now();
    const m = Math.floor(now.getTime() / 60_000);
    if (m !== minute) {
      minute = m;
      day = calendar.dateOf(now);
    }
    return day;
  };
}

export interface ParsedQueryCache<T> {
  /** The parsed query kept for this query text on the current business day, if any. */
  get(raw: string): T | undefined;
  set(raw: string, parsed: T): T;
  readonly size: number;
}

/**
 * Parsed, validated queries kept per query text for the business day: a desk asks for the same few
 * views again and again, and the same text always parses to the same query on the same day (a
 * default that depends on the date comes from the business calendar, so the day is part of the key:
 * a new day starts with an empty cache). Only queries that passed are kept; a refused one is checked
 * again each time, so its error answer is the same. At most `max` entries, the oldest put in going
 * first. A kept query is frozen, as every request with that text shares it.
 */
export function parsedQueryCache<T>(day: () => string, max = 256): ParsedQueryCache<T> {
  if (!(max >= 1)) throw new RangeError('a query cache keeps at least one query');
  let keptDay = '';
  const entries = new Map<string, T>();
  const sameDay = () => {
    const today = day();
    if (today !== keptDay) {
      entries.clear();
      keptDay = today;
    }
  };
  return {
    get(raw) {
      sameDay();
      return entries.get(raw);
    },
    set(raw, parsed) {
      sameDay();
      if (!entries.has(raw) && entries.size >= max) entries.delete(entries.keys().next().value as string);
      entries.set(raw, Object.freeze(parsed));
      return parsed;
    },
    get size() {
      return entries.size;
    },
  };
}
