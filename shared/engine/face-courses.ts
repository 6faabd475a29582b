import type { Opening } from '../schemas/openings.schema';
import type { RoofSystem } from '../schemas/roof-system.schema';
import { JointScratch, type FaceBattens } from './battens';
import { doubleLapVergeCourse, halfToTileAndHalf, isBrokenCourse, isDoubleLapBrokenCourse, rakeToRakeCourse, vergeCourse, vergeToRakeCourse, type CoursePieces } from './bond';
import { clipRule, courseClips, type ClipRule } from './clips';
import { rowHeight, type CourseSetOut } from './courses';
import { nailedPieces } from './fixings';
import { widthAt, type FaceShape } from './geometry';
import type { FaceLoading } from './loading';
import type { VergeFit } from './tiles-per-course';

/**
 * Counting one face course by course: the scratch a job reuses from face to face, the pieces, nails
 * and clips of each course (between verges or to a raking edge) and what openings take out and add.
 */

/** Objects reused from face to face so a 10,000-face job does not allocate per course. */
export interface Scratch {
  joints: JointScratch;
  setOut: CourseSetOut;
  battens: FaceBattens;
  course: CoursePieces;
  brokenCourse: CoursePieces;
  rowPositions: number[];
  supportsByRow: number[];
  fit: VergeFit;
  loading: FaceLoading;
  /** Figures of the face just computed that the totals need but the face result does not show. */
  plan_m2: number;
  batten_mm: number;
  batten_nails: number;
  tile_nails: number;
  inset: { left: number; right: number };
  clips: ClipRule;
  /** Pieces of the face being counted, course by course. */
  pieces: PieceCounts;
  /** The face's counts as its openings change them. */
  counts: { whole: number; cut: number; removed: number; batten_mm: number; area_mm2: number };
  /** Slope area of the face less its openings, and of its openings, m² (unrounded). */
  net_slope_m2: number;
  openings_m2: number;
  /** Flashings of one copy of the face, mm. */
  flashings: { side: number; top: number; apron: number; back: number };
  roof_windows: number;
  hatches: number;
  /** Of the courses just counted: nailed pieces, clips, most tiles in a course, widest course (mm). */
  nailed: number;
  clipped: number;
  tilesPerCourse: number;
  widest: number;
  /**
   * What the courses and battens in this scratch were last counted for: system, pitch, rafter, eaves,
   * and for the courses the top and how many verges (0, 1 or 2; a face and its mirror image count the
   * same courses), for the battens the insets of the two raking edges. A face that matches the face
   * before it takes those counts from here.
   */
  lastSystem: RoofSystem | null;
  lastPitch: number;
  lastRafter: number;
  lastEaves: number;
  lastTop: number;
  lastVerges: number;
  lastInsetLeft: number;
  lastInsetRight: number;
  /**
   * The setting-out marks of the face before and what they were worked out from (tiles counted, cover
   * and overhang used): a face with the same three gets the same array (a result's arrays are read, never
   * written to).
   */
  lastMarks: number[] | null;
  lastMarksTiles: number;
  lastMarksCover: number;
  lastMarksOverhang: number;
}

interface PieceCounts {
  whole: number;
  halves: number;
  cut: number;
  eaves: number;
  top: number;
  tah: number;
}

/**
 * Adds one course's pieces to a face's counts. Double lap: the under-eaves course (0) is of short eaves
 * tiles and the top course (courses − 1) of short top tiles, every piece of them (their raking cuts are
 * cut from them too).
 */
function addCourse(t: PieceCounts, course: CoursePieces, i: number, courses: number, doubleLap: boolean) {
  if (doubleLap && (i === 0 || i === courses - 1)) {
    const n = course.whole + course.halves + course.cut + course.tah;
    if (i === 0) t.eaves += n;
    else t.top += n;
    return;
  }
  t.whole += course.whole;
  t.halves += course.halves;
  t.cut += course.cut;
  t.tah += course.tah;
}

/** Flashing runs past both sides of a chimney or dormer by 150 mm (common practice, no source). */
const FLASHING_PAST_SIDES_MM = 2 * 150;

/** What the openings of one copy of a face take out and add, applied to its counted pieces. */
export function applyOpenings(openings: readonly Opening[] | undefined, gaugeMm: number, coverMm: number, counts: { whole: number; cut: number; removed: number; batten_mm: number; area_mm2: number }, scratch: Scratch) {
  if (!openings) return;
  for (const o of openings) {
    const q = o.quantity;
    // Where the opening sits is not given: it crosses ceil(height ÷ gauge) courses, leaves out the whole
    // tiles its width spans and cuts one tile each side of it in each course (a minimum).
    const crossed = gaugeMm > 0 ? Math.ceil(o.height_mm / gaugeMm - 1e-9) : 1;
    const leftOut = Math.min(counts.whole, crossed * Math.floor(o.width_mm / coverMm + 1e-9) * q);
    counts.whole -= leftOut;
    counts.removed += leftOut;
    const toCut = Math.min(counts.whole, 2 * crossed * q);
    counts.whole -= toCut;
    counts.cut += toCut;
    counts.batten_mm += o.width_mm * crossed * q;
    counts.area_mm2 += o.width_mm * o.height_mm * q;
    if (o.kind === 'chimney') {
      scratch.flashings.side += 2 * o.height_mm * q;
      scratch.flashings.apron += (o.width_mm + FLASHING_PAST_SIDES_MM) * q;
      scratch.flashings.back += (o.width_mm + FLASHING_PAST_SIDES_MM) * q;
    } else if (o.kind === 'dormer') {
      scratch.flashings.side += 2 * o.height_mm * q;
      scratch.flashings.apron += (o.width_mm + FLASHING_PAST_SIDES_MM) * q;
    } else if (o.kind === 'roof_window') scratch.roof_windows += q;
    else scratch.hatches += q;
  }
}

/** Pieces, nails and clips of the courses of a face between two verges (into scratch). */
export function countVergeCourses(fit: VergeFit, C: number, system: RoofSystem, everyTileClipped: boolean, scratch: Scratch) {
  const tile = system.tile;
  const doubleLap = tile.kind === 'double_lap';
  const pieces = scratch.pieces;
  const straight = vergeCourse(fit, false, scratch.course);
  const broken = doubleLap ? doubleLapVergeCourse(fit, scratch.brokenCourse) : vergeCourse(fit, true, scratch.brokenCourse);
  let nailed = 0;
  let clips = 0;
  for (let i = 0; i < C; i++) {
    const course = (doubleLap ? isDoubleLapBrokenCourse(i, C) : isBrokenCourse(tile.bond, i)) ? broken : straight;
    addCourse(pieces, course, i, C, doubleLap);
    nailed += nailedPieces(system.fixing.rule, course, i, C);
    clips += courseClips(scratch.clips, course, i, 2, everyTileClipped);
  }
  scratch.nailed = nailed;
  scratch.clipped = clips;
}

/**
 * Pieces, nails and clips of the courses of a face with a raking edge, each course as wide as the
 * face at it; the widest course and the most tiles in a course (into scratch).
 */
export function countRakingCourses(shape: FaceShape, setOut: CourseSetOut, oneVerge: boolean, overhang: number, system: RoofSystem, everyTileClipped: boolean, scratch: Scratch) {
  const tile = system.tile;
  const cover = tile.cover_width_mm;
  const doubleLap = tile.kind === 'double_lap';
  const pieces = scratch.pieces;
  const C = setOut.courses;
  let nailed = 0;
  let clips = 0;
  let tilesPerCourse = 0;
  let widest = 0;
  for (let i = 0; i < C; i++) {
    const y = rowHeight(setOut, i);
    // A course must reach the raking edge over the whole tile, from its tail up to its batten.
    const width = Math.max(widthAt(shape, Math.max(0, y - tile.length_mm)), widthAt(shape, Math.min(shape.rafter_mm, y)));
    if (width > widest) widest = width;
    const brokenHere = doubleLap ? isDoubleLapBrokenCourse(i, C) : isBrokenCourse(tile.bond, i);
    const course: CoursePieces = oneVerge ? vergeToRakeCourse(width, overhang, tile.width_mm, cover.nominal, brokenHere, scratch.course) : rakeToRakeCourse(width, tile.width_mm, cover.nominal, scratch.course);
    if (doubleLap) halfToTileAndHalf(course);
    addCourse(pieces, course, i, C, doubleLap);
    nailed += nailedPieces(system.fixing.rule, course, i, C);
    clips += courseClips(scratch.clips, course, i, oneVerge ? 1 : 0, everyTileClipped);
    const inCourse = Math.ceil(course.whole + course.cut + course.halves / 2 + course.tah * 1.5 - 1e-9);
    if (inCourse > tilesPerCourse) tilesPerCourse = inCourse;
  }
  scratch.nailed = nailed;
  scratch.clipped = clips;
  scratch.tilesPerCourse = tilesPerCourse;
  scratch.widest = widest;
}

/** Scratch for one job (one per estimate, reused face after face). */
export function newScratch(system: RoofSystem): Scratch {
  return {
    joints: new JointScratch(),
    setOut: { headlap_mm: 0, max_gauge_mm: 0, gauge_mm: 0, gauges: 0, courses: 0, first_batten_mm: 0, top_batten_mm: 0, tiny: false, eaves_course: false },
    battens: { batten_mm: 0, crossings: 0, joints: 0, stagger_relaxed: 0, forced_short: 0 },
    course: { whole: 0, halves: 0, cut: 0, perimeter: 0, tah: 0 },
    brokenCourse: { whole: 0, halves: 0, cut: 0, perimeter: 0, tah: 0 },
    rowPositions: [],
    supportsByRow: [],
    fit: { tiles: 0, cover_mm: 0, overhang_mm: 0, fits: false },
    loading: { positions: 0, stacks: 0, stacks_by_row: [], needed_stack: null },
    plan_m2: 0,
    batten_mm: 0,
    batten_nails: 0,
    tile_nails: 0,
    inset: { left: 0, right: 0 },
    clips: clipRule(system),
    pieces: { whole: 0, halves: 0, cut: 0, eaves: 0, top: 0, tah: 0 },
    counts: { whole: 0, cut: 0, removed: 0, batten_mm: 0, area_mm2: 0 },
    net_slope_m2: 0,
    openings_m2: 0,
    flashings: { side: 0, top: 0, apron: 0, back: 0 },
    roof_windows: 0,
    hatches: 0,
    nailed: 0,
    clipped: 0,
    tilesPerCourse: 0,
    widest: 0,
    lastSystem: null,
    lastPitch: 0,
    lastRafter: 0,
    lastEaves: 0,
    lastTop: 0,
    lastVerges: -1,
    lastInsetLeft: 0,
    lastInsetRight: 0,
    lastMarks: null,
    lastMarksTiles: 0,
    lastMarksCover: 0,
    lastMarksOverhang: 0,
  };
}
