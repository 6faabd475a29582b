import { describe, expect, it } from 'vitest';
import { BusinessCalendar, addDays, addMonths, dateInZone, daysBetween, isIsoDate, isValidTimeZone, isWorkingDay, nextWorkingDay, startOfWeek } from './business-calendar';

describe('business calendar', () => {
  it('takes the day from the firm time zone, not from UTC', () => {
    // 23:30 UTC on 30 June is already 1 July in London (BST, UTC+1) and still 30 June in New York.
    const instant = new Date('2026-06-30T23:30:00Z');
    expect(dateInZone(instant, 'Europe/London')).toBe('2026-07-01');
    expect(dateInZone(instant, 'America/New_York')).toBe('2026-06-30');
    expect(dateInZone(instant, 'UTC')).toBe('2026-06-30');
  });

  it('is on GMT in winter: 23:30 UTC on 5 December is still 5 December in London', () => {
    expect(new BusinessCalendar('Europe/London', () => new Date('2026-12-05T23:30:00Z')).today()).toBe('2026-12-05');
  });

  it('counts today from its own clock', () => {
    const cal = new BusinessCalendar('Europe/London', () => new Date('2026-03-29T00:30:00Z'));
    expect(cal.today()).toBe('2026-03-29');
    expect(cal.fromToday(1)).toBe('2026-03-30');
    expect(cal.isToday('2026-03-29')).toBe(true);
    expect(cal.isPast('2026-03-28')).toBe(true);
    expect(cal.isPast('2026-03-29')).toBe(false);
    expect(cal.dateOf('2026-08-01T23:10:00Z')).toBe('2026-08-02');
  });

  it('refuses an unknown time zone', () => {
    expect(isValidTimeZone('Europe/Nowhere')).toBe(false);
    expect(isValidTimeZone('')).toBe(false);
    expect(() => new BusinessCalendar('Mars/Olympus')).toThrow(/Unknown time zone/);
  });

  it('does date arithmetic across month, year and leap-day ends', () => {
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28');
    expect(daysBetween('2026-12-05', '2028-12-05')).toBe(731);
    expect(addMonths('2026-01-31', 1)).toBe('2026-02-28');
    expect(addMonths('2026-12-05', 24)).toBe('2028-12-05');
  });

  it('knows working days: Saturday 5 December 2026 is not one, Monday 7th is next', () => {
    expect(isWorkingDay('2026-12-05')).toBe(false);
    expect(isWorkingDay('2026-12-07')).toBe(true);
    expect(nextWorkingDay('2026-12-04')).toBe('2026-12-07');
    expect(startOfWeek('2026-12-05')).toBe('2026-11-30');
    expect(startOfWeek('2026-12-06')).toBe('2026-11-30');
  });

  it('accepts only real dates', () => {
    expect(isIsoDate('2026-02-29')).toBe(false);
    expect(isIsoDate('2028-02-29')).toBe(true);
    expect(isIsoDate('9999-12-31')).toBe(true);
    expect(isIsoDate('2026-6-1')).toBe(false);
    expect(() => addDays('2026-13-01', 1)).toThrow(RangeError);
  });
});
