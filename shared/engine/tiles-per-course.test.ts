import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DEFAULT_TILE, SYSTEM_DEFAULTS } from './defaults';
import { fitBetweenVerges, tilesToSpan } from './tiles-per-course';

const cover = DEFAULT_TILE.cover_width_mm; // 297 / 300 / 303
const overhang = SYSTEM_DEFAULTS.setting_out.verge_overhang_mm; // 30 / 45 / 60
const w = DEFAULT_TILE.width_mm; // 330

describe('tiles per course between two verges', () => {
  it('lays whole tiles at nominal cover when the width allows it, overhanging each verge by the target', () => {
    // 30 tiles span 29 × 300 + 330 = 9030 = 8940 + 2 × 45.
    expect(fitBetweenVerges(8_940, w, cover, overhang)).toEqual({ tiles: 30, cover_mm: 300, overhang_mm: 45, fits: true });
  });

  it('spreads the tiles 2–3 mm at the side lock to finish on whole tiles (common practice)', () => {
    const fit = fitBetweenVerges(9_000, w, cover, overhang);
    expect(fit.fits).toBe(true);
    expect(fit.tiles).toBe(30);
    expect(fit.overhang_mm).toBeCloseTo(45, 9);
    expect(fit.cover_mm - cover.nominal).toBeGreaterThan(2);
    expect(fit.cover_mm - cover.nominal).toBeLessThanOrEqual(3);
    // The span is exact: (n − 1) × cover + width = face width + 2 × overhang.
    expect(29 * fit.cover_mm + w).toBeCloseTo(9_000 + 2 * fit.overhang_mm, 9);
  });

  it('closes the tiles up at the side lock when that is nearer the nominal cover than spreading', () => {
    const fit = fitBetweenVerges(8_900, w, cover, overhang);
    expect(fit).toMatchObject({ tiles: 30, fits: true });
    expect(fit.cover_mm).toBeCloseTo((8_900 + 90 - 330) / 29, 9);
    expect(fit.cover_mm).toBeLessThan(300);
  });

  it('of two whole numbers of tiles that fit, takes the one whose cover at the target overhang is nearest the nominal', () => {
    const wide = { min: 290, nominal: 300, max: 310 }; // a tile with more side-lock play than the default
    // 9150 mm: 30 gaps need 297 mm of cover at 45 mm overhang, 29 gaps 307.2 mm; 297 is nearer 300.
    expect(fitBetweenVerges(9_150, w, wide, overhang)).toEqual({ tiles: 31, cover_mm: 297, overhang_mm: 45, fits: true });
    // 9000 mm: 29 gaps need 302.1 mm, 30 gaps 292 mm; 302.1 is nearer.
    const fit = fitBetweenVerges(9_000, w, wide, overhang);
    expect(fit).toMatchObject({ tiles: 30, overhang_mm: 45, fits: true });
    expect(fit.cover_mm).toBeCloseTo(8_760 / 29, 9);
  });

  it('moves the overhang within its range when the play alone cannot close the gap', () => {
    // 8 tiles at maximum cover reach 7 × 303 + 330 = 2451; the verge overhangs then take the rest.
    const fit = fitBetweenVerges(2_380, w, cover, overhang);
    expect(fit).toMatchObject({ tiles: 8, cover_mm: 303, fits: true });
    expect(fit.overhang_mm).toBeCloseTo(35.5, 9);
  });

  it('says when no whole number of tiles fits, and then counts one tile a course to be cut', () => {
    const fit = fitBetweenVerges(2_400, w, cover, overhang);
    expect(fit.fits).toBe(false);
    expect(fit.tiles).toBe(9); // 7.2 covers past the first tile at nominal: 8 whole and a cut one
    expect(fit.cover_mm).toBe(300);
    expect(fit.overhang_mm).toBe(45);
  });

  it('lets one tile cover a face narrower than a tile when the overhangs allow', () => {
    expect(fitBetweenVerges(240, w, cover, overhang)).toMatchObject({ tiles: 1, overhang_mm: 45, fits: true });
    expect(fitBetweenVerges(10, w, cover, overhang)).toMatchObject({ tiles: 1, fits: false });
  });

  it('never lays fewer tiles on a wider face (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 100_000, noNaN: true }), fc.double({ min: 0, max: 5_000, noNaN: true }), (width, more) => {
        const a = fitBetweenVerges(width, w, cover, overhang);
        const b = fitBetweenVerges(width + more, w, cover, overhang);
        return b.tiles >= a.tiles;
      }),
      { numRuns: 2_000 },
    );
  });

  it('keeps the cover inside its play and the overhang inside its range whenever it says the tiles fit (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 100_000, noNaN: true }), (width) => {
        const f = fitBetweenVerges(width, w, cover, overhang);
        if (!f.fits) return f.cover_mm === cover.nominal && f.overhang_mm === overhang.target;
        const spanOk = Math.abs((f.tiles - 1) * f.cover_mm + w - (width + 2 * f.overhang_mm)) < 1e-6;
        return spanOk && f.overhang_mm >= overhang.min - 1e-6 && f.overhang_mm <= overhang.max + 1e-6 && (f.tiles === 1 || (f.cover_mm >= cover.min - 1e-6 && f.cover_mm <= cover.max + 1e-6));
      }),
      { numRuns: 2_000 },
    );
  });
});

describe('tiles to span a course', () => {
  it('counts the first tile at its full width and the rest at their cover', () => {
    expect(tilesToSpan(0, 330, 300)).toBe(0);
    expect(tilesToSpan(330, 330, 300)).toBe(1);
    expect(tilesToSpan(630, 330, 300)).toBe(2);
    expect(tilesToSpan(631, 330, 300)).toBe(3);
  });

  it('never needs fewer tiles for more span (property)', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 100_000, noNaN: true }), fc.double({ min: 0, max: 1_000, noNaN: true }), (a, d) => tilesToSpan(a + d, 330, 300) >= tilesToSpan(a, 330, 300)));
  });
});
