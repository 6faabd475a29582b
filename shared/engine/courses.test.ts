import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { roofSystemSchema, type RoofSystemInput } from '../schemas/roof-system.schema';
import { headlapFor, lowestPitch, maxGauge, rowHeight, setOutCourses, tilesPerSquareMetre } from './courses';

const system = (input: RoofSystemInput = {}) => roofSystemSchema.parse(input);

const plainTile = {
  kind: 'double_lap' as const,
  length_mm: 265,
  width_mm: 165,
  headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }],
  weight_kg: 1.1,
  per_pallet: 1000,
};
const slate = {
  kind: 'double_lap' as const,
  length_mm: 500,
  width_mm: 250,
  headlap_mm: [{ from_pitch_deg: 20, min_mm: 75 }],
  weight_kg: 2,
  per_pallet: 800,
};

describe('double-lap gauge = (length − headlap) ÷ 2', () => {
  // Published: A Treatise on Architecture and Building Construction (Colliery Engineer Co.),
  // estimating volume: "deduct the lap from the length of the slate, and divide the remainder by 2".
  it('a 20 in slate with a 3 in lap has an 8½ in gauge (Treatise worked example, published)', () => {
    expect(maxGauge('double_lap', 20, 3)).toBe(8.5);
  });

  it('a 265 × 165 mm plain tile at 65 mm headlap sets out at 100 mm gauge, about 60 tiles per m² (derived from the Treatise rule)', () => {
    expect(maxGauge('double_lap', 265, 65)).toBe(100);
    expect(tilesPerSquareMetre(100, 165)).toBeCloseTo(60.6, 1);
    // A face whose batten span is a whole number of 100 mm gauges is laid at exactly 100 mm.
    const s = system({ tile: plainTile, setting_out: { eaves_overhang_mm: 50, top_gap_mm: 40 } });
    const c = setOutCourses(215 + 7_000 + 40, 40, s);
    expect(c?.gauge_mm).toBe(100);
    expect(c?.gauges).toBe(70);
    expect(c?.courses).toBe(72); // 70 gauges + the top course + the under-eaves course
  });

  it('a 500 × 250 mm slate at 75 mm headlap sets out at 212.5 mm gauge, 18.8 slates per m² (derived from the Treatise rule)', () => {
    expect(maxGauge('double_lap', 500, 75)).toBe(212.5);
    expect(tilesPerSquareMetre(212.5, 250)).toBeCloseTo(18.8, 1);
    expect(tilesPerSquareMetre(212.5, 255)).toBeCloseTo(18.45, 2); // with a 5 mm side joint
    const s = system({ tile: slate });
    const c = setOutCourses(450 + 20 * 212.5 + 40, 30, s);
    expect(c?.gauge_mm).toBeCloseTo(212.5, 9);
  });
});

describe('single-lap gauge = length − headlap', () => {
  it('a 420 mm flat interlocking tile at 100 mm minimum headlap sets out at a 320 mm gauge (common practice)', () => {
    expect(maxGauge('single_lap', 420, 100)).toBe(320);
    // The default tile's lowest band is 100 mm: a face with three gauges of 320 between its battens.
    const s = system();
    const first = 420 - 50;
    const c = setOutCourses(first + 3 * 320 + 40, 25, s);
    expect(c).toMatchObject({ headlap_mm: 100, max_gauge_mm: 320, gauge_mm: 320, gauges: 3, courses: 4 });
  });

  it('closes the gauge up rather than exceed the maximum: one mm more needs another course', () => {
    const s = system();
    const c = setOutCourses(370 + 3 * 320 + 1 + 40, 25, s);
    expect(c?.gauges).toBe(4);
    expect(c?.gauge_mm).toBeCloseTo(961 / 4, 9);
  });
});

describe('headlap by pitch band', () => {
  const bands = [
    { from_pitch_deg: 30, min_mm: 75 },
    { from_pitch_deg: 22.5, min_mm: 100 },
  ];
  it('takes the band at or below the pitch, whatever order the bands are given in', () => {
    expect(headlapFor(bands, 22.5)).toBe(100);
    expect(headlapFor(bands, 29.9)).toBe(100);
    expect(headlapFor(bands, 30)).toBe(75);
    expect(headlapFor(bands, 60)).toBe(75);
  });
  it('has no headlap below the lowest band, which is the lowest pitch', () => {
    expect(headlapFor(bands, 22.4)).toBeNull();
    expect(lowestPitch(bands)).toBe(22.5);
    expect(setOutCourses(5_000, 20, system())).toBeNull();
  });
});

describe('courses', () => {
  it('gives a face too short for two battens one course on one row, with gauge 0', () => {
    const c = setOutCourses(300, 35, system());
    expect(c).toMatchObject({ tiny: true, courses: 1, gauge_mm: 0 });
    const d = setOutCourses(200, 40, system({ tile: plainTile }));
    expect(d).toMatchObject({ tiny: true, courses: 2 });
  });

  it('puts the under-eaves batten of a face too short for two battens below the other one, not on it', () => {
    const c = setOutCourses(200, 40, system({ tile: plainTile }));
    if (!c) throw new Error('no set-out');
    expect(c.courses).toBe(2);
    expect(rowHeight(c, 0)).toBe(60); // one maximum gauge (100 mm) below the batten at 160 mm
    expect(rowHeight(c, 1)).toBe(160);
  });

  it('puts the first batten at tile length − eaves overhang and the top one top_gap below the top', () => {
    const s = system();
    const c = setOutCourses(5_000, 35, s);
    if (!c) throw new Error('no set-out');
    expect(rowHeight(c, 0)).toBe(370);
    expect(rowHeight(c, c.courses - 1)).toBeCloseTo(4_960, 9);
    const fixedFirst = setOutCourses(5_000, 35, system({ setting_out: { first_batten_mm: 330 } }));
    expect(fixedFirst?.first_batten_mm).toBe(330);
  });

  it('never sets a gauge above the maximum and always spans the battens exactly (property)', () => {
    const s = system();
    const p = system({ tile: plainTile });
    fc.assert(
      fc.property(fc.double({ min: 100, max: 100_000, noNaN: true }), fc.double({ min: 35, max: 89, noNaN: true }), (rafter, pitch) => {
        for (const sys of [s, p]) {
          const c = setOutCourses(rafter, pitch, sys);
          if (!c) return false;
          if (c.gauge_mm > c.max_gauge_mm + 1e-9) return false;
          if (!c.tiny && Math.abs(c.gauges * c.gauge_mm - (c.top_batten_mm - c.first_batten_mm)) > 1e-6) return false;
          if (!c.tiny && c.courses !== c.gauges + (sys.tile.kind === 'double_lap' ? 2 : 1)) return false;
          // One gauge fewer would need a gauge above the maximum.
          if (!c.tiny && c.gauges > 1 && (c.top_batten_mm - c.first_batten_mm) / (c.gauges - 1) <= c.max_gauge_mm) return false;
        }
        return true;
      }),
      { numRuns: 300 },
    );
  });
});
