import { describe, expect, it } from 'vitest';
import { formatMoney } from './money';

describe('formatMoney', () => {
  it('shows minor units as the currency people read, with thousands and two decimals', () => {
    expect(formatMoney(123_450, 'GBP')).toBe('£1,234.50');
    expect(formatMoney(5, 'gbp')).toBe('£0.05');
    expect(formatMoney(-2_000, 'EUR')).toBe('-€20.00');
  });

  it('refuses a currency code that is not ISO 4217', () => {
    expect(() => formatMoney(100, 'POUNDS')).toThrow(RangeError);
  });
});
