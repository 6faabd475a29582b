import { formatMoney as formatMoneyIn } from '../../shared/domain/money';

const dateFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
const dateTimeFormat = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
});

/** SQLite hands out "YYYY-MM-DD HH:MM:SS" in UTC without a zone; treat it as UTC. */
export function parseTimestamp(value: string): Date | null {
  const iso = /^\d{4}-\d{2}-\d{2} \d{2}:\d{2}/.test(value) ? `${value.replace(' ', 'T')}Z` : value;
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? null : date;
}

export function formatDate(value: string): string {
  const date = parseTimestamp(value);
  return date ? dateFormat.format(date) : value;
}

export function formatDateTime(value: string): string {
  const date = parseTimestamp(value);
  return date ? dateTimeFormat.format(date) : value;
}

/** The first word of a person's name, for greetings. */
export function firstName(name: string): string {
  return name.trim().split(/\s+/)[0] ?? name;
}

/** The currency the app's prices are kept in (the server's CURRENCY; a screen shows no other). */
export const APP_CURRENCY = 'GBP';

/** Minor units (pence) as the screen shows them, through the one money formatter; a dash for none. */
export function formatMoney(minor: number | null | undefined, currency: string = APP_CURRENCY): string {
  if (minor === null || minor === undefined) return '—';
  return formatMoneyIn(minor, currency);
}

const counts = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 2 });

/**
 * A count or quantity for the screen (packs, tiles, kilograms), with thousands separators: one number
 * format on every side of the product (1,593, not 1593).
 */
export function formatCount(value: number | null | undefined): string {
  if (value === null || value === undefined) return '—';
  return counts.format(value);
}
