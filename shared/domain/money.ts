const formats = new Map<string, Intl.NumberFormat>();

/**
 * Minor units (pence, cents) in the given ISO 4217 currency as people read them (£1,234.50). Money
 * travels as whole minor units everywhere and becomes a decimal only here, at the edge of a screen,
 * a document or an e-mail. An unknown currency code throws a RangeError.
 */
export function formatMoney(minor: number, currency: string): string {
  const code = currency.toUpperCase();
  let format = formats.get(code);
  if (!format) {
    format = new Intl.NumberFormat('en-GB', { style: 'currency', currency: code });
    formats.set(code, format);
  }
  return format.format(minor / 100);
}
