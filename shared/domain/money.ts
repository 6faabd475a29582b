/** The currency money is kept in when nothing configures another (the server's CURRENCY default). */
export const DEFAULT_CURRENCY = 'GBP';

const formats = new Map<string, { format: Intl.NumberFormat; perMajor: number }>();

function currencyFormat(currency: string) {
  const code = currency.toUpperCase();
  let entry = formats.get(code);
  if (!entry) {
    const format = new Intl.NumberFormat('en-GB', { style: 'currency', currency: code });
    // Minor units per major unit from the currency's own decimals: 100 pence to the pound, 1 yen to the yen.
    entry = { format, perMajor: 10 ** (format.resolvedOptions().maximumFractionDigits ?? 2) };
    formats.set(code, entry);
  }
  return entry;
}

/**
 * Minor units (pence, cents) in the given ISO 4217 currency as people read them (£1,234.50). Money
 * travels as whole minor units everywhere and becomes a decimal only here, at the edge of a screen,
 * a document or an e-mail: this is the one money formatter of the server and the browser alike. A
 * currency without decimals (JPY) counts whole units. An unknown currency code throws a RangeError.
 */
export function formatMoney(minor: number, currency: string): string {
  const { format, perMajor } = currencyFormat(currency);
  return format.format(minor / perMajor);
}

/** The sign people read for a currency (£, €, US$), for labels such as "Pack price in £". */
export function currencySymbol(currency: string): string {
  return (
    currencyFormat(currency)
      .format.formatToParts(0)
      .find((p) => p.type === 'currency')?.value ?? currency.toUpperCase()
  );
}
