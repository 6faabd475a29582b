import type { HeadlapBand, RoofSystem } from '../schemas/roof-system.schema';

/** Floating-point slack when a distance is an exact multiple of the gauge (960 ÷ 320 must give 3). */
const EPS = 1e-9;

/**
 * Minimum headlap in mm for a pitch: the band with the highest from_pitch_deg at or below the pitch.
 * Null below the lowest band, which is the lowest pitch the tile may be laid at.
 */
export function headlapFor(bands: readonly HeadlapBand[], pitchDeg: number): number | null {
  let found: number | null = null;
  let foundFrom = -Infinity;
  for (const band of bands) {
    if (band.from_pitch_deg <= pitchDeg + EPS && band.from_pitch_deg > foundFrom) {
      found = band.min_mm;
      foundFrom = band.from_pitch_deg;
    }
  }
  return found;
}

/** Lowest pitch in degrees the tile may be laid at (its lowest headlap band). */
export function lowestPitch(bands: readonly HeadlapBand[]): number {
  let low = Infinity;
  for (const band of bands) low = Math.min(low, band.from_pitch_deg);
  return low;
}

/**
 * Maximum gauge in mm. Single lap: length − headlap. Double lap: (length − headlap) ÷ 2, because each
 * tile is lapped by the course above and the one above that.
 */
export function maxGauge(kind: 'single_lap' | 'double_lap', lengthMm: number, headlapMm: number): number {
  return kind === 'double_lap' ? (lengthMm - headlapMm) / 2 : lengthMm - headlapMm;
}

/** Tiles per m² for a gauge and a cover width in mm: 1 ÷ (gauge × cover). */
export function tilesPerSquareMetre(gaugeMm: number, coverMm: number): number {
  return 1e6 / (gaugeMm * coverMm);
}

export interface CourseSetOut {
  headlap_mm: number;
  max_gauge_mm: number;
  /** Gauge used, mm; 0 when the face is too short for two battens. */
  gauge_mm: number;
  /** Number of gauges between the first and the top batten. */
  gauges: number;
  courses: number;
  first_batten_mm: number;
  top_batten_mm: number;
  /** True when the face is too short for a first and a top batten. */
  tiny: boolean;
  /** Double lap has an extra under-eaves course (and batten) below the first full course. */
  eaves_course: boolean;
}

/**
 * Courses and gauge of one face. The first batten sits first_batten_mm up the slope from the eaves line
 * (default tile length − eaves overhang), the top batten top_gap_mm below the top edge; between them
 * D = k gauges with k = ceil(D ÷ max gauge), gauge = D ÷ k. Courses = k + 1 (single lap) or k + 2
 * (double lap, with its under-eaves course). Null when the pitch is below the tile's lowest band.
 * Writes into `out` when given.
 */
export function setOutCourses(rafterMm: number, pitchDeg: number, system: RoofSystem, out?: CourseSetOut): CourseSetOut | null {
  const tile = system.tile;
  const headlap = headlapFor(tile.headlap_mm, pitchDeg);
  if (headlap === null) return null;
  const maxG = maxGauge(tile.kind, tile.length_mm, headlap);
  const first = system.setting_out.first_batten_mm ?? tile.length_mm - system.setting_out.eaves_overhang_mm;
  const top = rafterMm - system.setting_out.top_gap_mm;
  const distance = top - first;
  const doubleLap = tile.kind === 'double_lap';
  if (!(distance > 0) || !(maxG > 0)) {
    // Too short for two battens: one course of tiles (two for double lap) on a single batten row.
    const only = Math.max(0, Math.min(first, top));
    return fill(out, headlap, maxG, 0, 0, doubleLap ? 2 : 1, only, only, true, doubleLap);
  }
  const k = Math.max(1, Math.ceil(distance / maxG - EPS));
  return fill(out, headlap, maxG, distance / k, k, doubleLap ? k + 2 : k + 1, first, top, false, doubleLap);
}

function fill(out: CourseSetOut | undefined, headlap: number, maxG: number, gauge: number, gauges: number, courses: number, first: number, top: number, tiny: boolean, eavesCourse: boolean): CourseSetOut {
  const c: CourseSetOut = out ?? {
    headlap_mm: 0,
    max_gauge_mm: 0,
    gauge_mm: 0,
    gauges: 0,
    courses: 0,
    first_batten_mm: 0,
    top_batten_mm: 0,
    tiny: false,
    eaves_course: false,
  };
  c.headlap_mm = headlap;
  c.max_gauge_mm = maxG;
  c.gauge_mm = gauge;
  c.gauges = gauges;
  c.courses = courses;
  c.first_batten_mm = first;
  c.top_batten_mm = top;
  c.tiny = tiny;
  c.eaves_course = eavesCourse;
  return c;
}

/**
 * Height of batten row i (0 = eaves) in mm up the slope from the eaves line. The under-eaves batten of
 * a double-lap roof sits one gauge below the first batten (the maximum gauge on a face too short for
 * two battens, so the two rows never share a height), never below the eaves line.
 */
export function rowHeight(c: CourseSetOut, i: number): number {
  if (c.eaves_course) {
    if (i === 0) return Math.max(0, c.first_batten_mm - (c.gauge_mm > 0 ? c.gauge_mm : c.max_gauge_mm));
    return c.first_batten_mm + (i - 1) * c.gauge_mm;
  }
  return c.first_batten_mm + i * c.gauge_mm;
}
