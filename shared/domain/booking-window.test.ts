import { describe, expect, it } from 'vitest';
import { BusinessCalendar } from './business-calendar';
import { bookingDateProblem, bookingWindow } from './booking-window';

const calendar = new BusinessCalendar('Europe/London', () => new Date('2026-12-05T10:00:00Z'));

describe('the booking window', () => {
  it('runs from today to the same day two years on', () => {
    expect(bookingWindow(calendar)).toEqual({ first: '2026-12-05', last: '2028-12-05' });
  });

  it('refuses yesterday and the day after the window, and takes both ends', () => {
    expect(bookingDateProblem(calendar, '2026-12-04')).toBe('must be today or later');
    expect(bookingDateProblem(calendar, '2026-12-05')).toBeNull();
    expect(bookingDateProblem(calendar, '2028-12-05')).toBeNull();
    expect(bookingDateProblem(calendar, '2028-12-06')).toMatch(/within two years/);
    expect(bookingDateProblem(calendar, '9999-12-31')).toMatch(/within two years/);
  });
});
