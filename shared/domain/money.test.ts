import { describe, expect, it } from 'vitest';
import { currencySymbol, formatMoney } from './money';
import { minorDigits, moneyEntryText, readMoneyEntry } from './money-entry';

// Minor units and symbols per ISO 4217 (the currencies' exponents: GBP 2, EUR 2, JPY 0).
describe('formatMoney', () => {
  it('shows minor units as the currency people read, with thousands and two decimals', () => {
    expect(formatMoney(123_450, 'GBP')).toBe('£1,234.50');
    expect(formatMoney(5, 'gbp')).toBe('£0.05');
    expect(formatMoney(-2_000, 'EUR')).toBe('-€20.00');
  });

  it('formats the same amount in each configured currency with its own sign', () => {
    expect(formatMoney(987_654, 'GBP')).toBe('£9,876.54');
    expect(formatMoney(987_654, 'EUR')).toBe('€9,876.54');
    expect(formatMoney(987_654, 'USD')).toBe('US$9,876.54');
  });

  it('names the sign of each currency for labels', () => {
    expect(currencySymbol('GBP')).toBe('£');
    expect(currencySymbol('eur')).toBe('€');
  });

  it('counts whole units in a currency without decimals', () => {
    expect(formatMoney(1_500, 'JPY')).toBe('JP¥1,500');
  });

  it('refuses a currency code that is not ISO 4217', () => {
    expect(() => formatMoney(100, 'POUNDS')).toThrow(RangeError);
  });
});

// ISO 4217 minor units: GBP and EUR 2 decimals, JPY 0, BHD 3 (1 dinar = 1,000 fils).
describe('readMoneyEntry', () => {
  const read = (text: string, currency: string) => readMoneyEntry(text, currency, 'the pack price');

  it("knows each currency's decimals", () => {
    expect([minorDigits('GBP'), minorDigits('eur'), minorDigits('JPY'), minorDigits('BHD')]).toEqual([2, 2, 0, 3]);
  });

  it('reads pounds and pence typed with or without the sign, thousands and trailing decimals', () => {
    expect(read('12.8', 'GBP')).toEqual({ ok: true, minor: 1280 });
    expect(read(' £1,250.05 ', 'GBP')).toEqual({ ok: true, minor: 125_005 });
    expect(read('£ 3', 'GBP')).toEqual({ ok: true, minor: 300 });
    expect(read('GBP 0.05', 'GBP')).toEqual({ ok: true, minor: 5 });
  });

  it('reads euro with the euro sign and yen in whole units with either of its signs', () => {
    expect(read('€9,876.54', 'EUR')).toEqual({ ok: true, minor: 987_654 });
    expect(read('¥1,500', 'JPY')).toEqual({ ok: true, minor: 1_500 });
    expect(read('JP¥ 1500', 'JPY')).toEqual({ ok: true, minor: 1_500 });
    expect(read('1500', 'jpy')).toEqual({ ok: true, minor: 1_500 });
  });

  it('reads three decimals of the dinar', () => {
    expect(read('12.345', 'BHD')).toEqual({ ok: true, minor: 12_345 });
    expect(read('BHD 0.5', 'BHD')).toEqual({ ok: true, minor: 500 });
  });

  it('refuses more decimals than the currency has, naming the field and the decimals allowed', () => {
    expect(read('12.805', 'GBP')).toEqual({ ok: false, message: 'the pack price must be an amount in £ with at most 2 decimals, e.g. 12.80' });
    expect(read('12.5', 'JPY')).toEqual({ ok: false, message: 'the pack price must be an amount in JP¥ with no decimals, e.g. 1280' });
    expect(read('1.2345', 'BHD')).toEqual({ ok: false, message: 'the pack price must be an amount in BHD with at most 3 decimals, e.g. 12.800' });
  });

  it("refuses another currency's sign, a decimal comma, a minus and words", () => {
    for (const text of ['€12.80', '$12', '12,80', '1,2345', '-3', '12.80p', 'twelve', '', '.5', '12.']) expect(read(text, 'GBP').ok).toBe(false);
    expect(read('£12', 'EUR').ok).toBe(false);
  });

  it('writes minor units back as they are typed, so an edited field reads back the same amount', () => {
    expect(moneyEntryText(1280, 'GBP')).toBe('12.80');
    expect(moneyEntryText(5, 'GBP')).toBe('0.05');
    expect(moneyEntryText(1280, 'JPY')).toBe('1280');
    expect(moneyEntryText(128, 'BHD')).toBe('0.128');
    for (const [minor, currency] of [
      [1280, 'GBP'],
      [7, 'BHD'],
      [99, 'JPY'],
    ] as const)
      expect(read(moneyEntryText(minor, currency), currency)).toEqual({ ok: true, minor });
  });
});
