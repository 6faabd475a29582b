import { currencySymbol } from './money';

// Kept apart from the formatter (money.ts), which every page loads: only the pages with a money field load the parser.

/** How many decimals the currency's minor unit has (ISO 4217's exponent, as the formatter reads it): GBP and EUR 2, JPY 0, BHD 3. */
export function minorDigits(currency: string): number {
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).resolvedOptions().maximumFractionDigits ?? 2;
}

/** The signs an amount typed in the currency may start with: its sign as shown (£, JP¥), its narrow sign (¥) and its code. */
function entrySigns(currency: string): string[] {
  const code = currency.toUpperCase();
  const narrow = new Intl.NumberFormat('en-GB', { style: 'currency', currency: code, currencyDisplay: 'narrowSymbol' }).formatToParts(0).find((p) => p.type === 'currency')?.value ?? code;
  // Longest first, so "JP¥" is taken whole before "¥" could match.
  return [...new Set([currencySymbol(code), narrow, code])].sort((a, b) => b.length - a.length);
}

/** A minor-unit amount written as it is typed, without sign or thousands: 1280 → "12.80" (GBP), "1280" (JPY), "1.280" (BHD). */
export function moneyEntryText(minor: number, currency: string): string {
  const digits = minorDigits(currency);
  const sign = minor < 0 ? '-' : '';
  const text = String(Math.abs(Math.round(minor))).padStart(digits + 1, '0');
  return digits === 0 ? `${sign}${text}` : `${sign}${text.slice(0, -digits)}.${text.slice(-digits)}`;
}

/** An example amount to type in the currency, with all its decimals: "12.80" (GBP), "1280" (JPY), "12.800" (BHD). */
export function moneyEntryExample(currency: string): string {
  return moneyEntryText(1280 * 10 ** Math.max(0, minorDigits(currency) - 2), currency);
}

export type MoneyEntry = { ok: true; minor: number } | { ok: false; message: string };

/**
 * An amount typed into a form field ("12.8", "12.80", "£1,250", "€ 3", "JPY 1,280") read into whole
 * minor units of the currency: digits, commas only between groups of three (so "12,80" is refused,
 * not read as 1,280), and at most as many decimals as the currency's minor unit has, optionally led
 * by the currency's sign or code. Anything else is refused with a message naming the field (`field`,
 * e.g. "the pack price") and the decimals the currency allows.
 */
export function readMoneyEntry(text: string, currency: string, field: string): MoneyEntry {
  const digits = minorDigits(currency);
  let t = text.trim();
  const sign = entrySigns(currency).find((s) => t.toUpperCase().startsWith(s.toUpperCase()));
  if (sign !== undefined) t = t.slice(sign.length).trimStart();
  const decimals = digits === 0 ? '' : `(?:\\.(\\d{1,${digits}}))?`;
  const match = new RegExp(`^(\\d{1,3}(?:,\\d{3})+|\\d+)${decimals}$`).exec(t);
  if (!match) {
    const allowed = digits === 0 ? 'no decimals' : `at most ${digits} decimal${digits === 1 ? '' : 's'}`;
    return { ok: false, message: `${field} must be an amount in ${currencySymbol(currency)} with ${allowed}, e.g. ${moneyEntryExample(currency)}` };
  }
  const whole = Number(match[1]!.replace(/,/g, ''));
  const fraction = Number((match[2] ?? '').padEnd(digits, '0') || '0');
  const minor = whole * 10 ** digits + fraction;
  if (!Number.isSafeInteger(minor)) return { ok: false, message: `${field} is too large` };
  return { ok: true, minor };
}
