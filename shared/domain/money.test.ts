import { describe, expect, it } from 'vitest';
import { currencySymbol, formatMoney } from './money';

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
