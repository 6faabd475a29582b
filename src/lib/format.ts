import { currencySymbol, DEFAULT_CURRENCY, formatMoney as formatMoneyIn } from '../../shared/domain/money';

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

/**
 * The currency every amount is kept and shown in: the server's CURRENCY, named by the session
 * (`setAppCurrency`, before any signed-in page shows). Until then, the server's default.
 */
let appCurrency = DEFAULT_CURRENCY;

/** Called with the session: the currency the server keeps money in. A code this browser cannot format is ignored. */
export function setAppCurrency(currency: string): void {
  try {
    formatMoneyIn(0, currency);
    appCurrency = currency.toUpperCase();
  } catch {
    // keep the one we have
  }
}

/** The configured currency (ISO 4217 code). */
export function currentCurrency(): string {
  return appCurrency;
}

/** The configured currency's sign (£, €), for labels of amounts typed or listed without one. */
export function moneySign(): string {
  return currencySymbol(appCurrency);
}

/** Minor units as the screen shows them, in the configured currency, through the one money formatter; a dash for none. */
export function formatMoney(minor: number | null | undefined): string {
  if (minor === null || minor === undefined) return '—';
  return formatMoneyIn(minor, appCurrency);
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
