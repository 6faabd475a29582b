import { describe, expect, it } from 'vitest';
import { BusinessCalendar } from '../../shared/domain/business-calendar';
import { businessDay, parsedQueryCache, rawQuery } from './query-cache';

describe('rawQuery', () => {
  it('is the text after the question mark, or nothing', () => {
    expect(rawQuery('/orders?status=sent&page=2')).toBe('status=sent&page=2');
    expect(rawQuery('/orders')).toBe('');
    expect(rawQuery('/orders?')).toBe('');
  });
});

describe('parsedQueryCache', () => {
  it('answers the same query text on the same day from memory, and misses on another text', () => {
    const cache = parsedQueryCache<{ page: number }>(() => '2026-12-05');
    expect(cache.get('page=1')).toBeUndefined();
    const kept = cache.set('page=1', { page: 1 });
    expect(cache.get('page=1')).toBe(kept);
    expect(cache.get('page=2')).toBeUndefined();
    expect(cache.get('page=1&sort=placed_at')).toBeUndefined();
  });

  it('misses when the business day changes (a default may depend on the date)', () => {
    let day = '2026-12-05';
    const cache = parsedQueryCache<{ from: string }>(() => day);
    cache.set('view=week', { from: '2026-11-30' });
    expect(cache.get('view=week')).toEqual({ from: '2026-11-30' });
    day = '2026-12-06';
    expect(cache.get('view=week')).toBeUndefined();
    expect(cache.size).toBe(0);
  });

  it('keeps at most its bound, the oldest put in going first', () => {
    const cache = parsedQueryCache<{ page: number }>(() => '2026-12-05', 3);
    for (let page = 1; page <= 5; page++) cache.set(`page=${page}`, { page });
    expect(cache.size).toBe(3);
    expect(cache.get('page=1')).toBeUndefined();
    expect(cache.get('page=2')).toBeUndefined();
    expect(cache.get('page=5')).toEqual({ page: 5 });
    // Putting a kept text again replaces it without pushing another out.
    cache.set('page=3', { page: 3 });
    expect(cache.size).toBe(3);
    expect(cache.get('page=4')).toEqual({ page: 4 });
  });

  it('freezes a kept query, as every request with that text shares it', () => {
    const cache = parsedQueryCache<{ page: number }>(() => '2026-12-05');
    const kept = cache.set('page=1', { page: 1 });
    expect(Object.isFrozen(kept)).toBe(true);
  });
});

describe('businessDay', () => {
  it("is the calendar's today in its time zone, worked out again when the minute moves", () => {
    let now = new Date('2026-12-05T23:59:30Z');
    const day = businessDay(new BusinessCalendar('Europe/Helsinki', () => now));
    // Helsinki is two hours ahead in December: already 6 December there.
    expect(day()).toBe('2026-12-06');
    now = new Date('2026-12-06T21:59:59Z');
    expect(day()).toBe('2026-12-06');
    now = new Date('2026-12-06T22:00:00Z');
    expect(day()).toBe('2026-12-07');
  });

  it('follows the business calendar, not the machine clock', () => {
    const now = new Date('2026-12-05T12:00:00Z');
    expect(businessDay(new BusinessCalendar('Pacific/Kiritimati', () => now))()).toBe('2026-12-06');
    expect(businessDay(new BusinessCalendar('Pacific/Pago_Pago', () => now))()).toBe('2026-12-05');
  });
});
