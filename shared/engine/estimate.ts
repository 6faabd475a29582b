import { checkOpeningsAgainstFaces, openingsSchema, type Opening } from '../schemas/openings.schema';
import type { RoofSystem, RoofSystemInput } from '../schemas/roof-system.schema';
import { FaceLookup, faceKey, scheduleSchema, type Face, type Schedule } from '../schemas/schedule.schema';
import { JointScratch, PieceTally, planFaceBattens, planStockLengths, type BattenRow, type FaceBattens } from './battens';
import { doubleLapVergeCourse, halfToTileAndHalf, isBrokenCourse, isDoubleLapBrokenCourse, rakeToRakeCourse, tilesForHalves, vergeCourse, vergeToRakeCourse, type CoursePieces } from './bond';
import { clipRule, clipsEveryTile, courseClips, type ClipRule } from './clips';
import { lowestPitch, rowHeight, setOutCourses, type CourseSetOut } from './courses';
import { EVERY_TILE_CLIP_PITCH_DEG, EVERY_TILE_PITCH_DEG, MAX_DELIVERY_PALLETS, RIDGE_BALANCE_TOLERANCE, SAFETY_CAUTIONS } from './defaults';
import { planDelivery } from './delivery';
import { battenNails, nailedPieces } from './fixings';
import { insets, isRaking, planAreaM2, rakingEdgeLength, slopeAreaM2, widthAt, type FaceShape } from './geometry';
import { loadingRowIndices, namedRidge, pairRidgeFaces, planFaceLoading, type FaceLoading, type RidgeBalance, type RidgeSide } from './loading';
import { BuildingEdgeTally } from './ridge-hip';
import type { EngineResult, EngineWarning, FaceResult, Flashings, InputProblem } from './result';
import { readOpeningsCsv } from './openings-parse';
import { parseRoofSystem } from './roof-system';
import { readScheduleCsv, type ScheduleWarning } from './schedule-parse';
import { settingOutMarks, settingOutReference, type SettingOutFrom } from './setting-out';
import { fitBetweenVerges, tilesToSpan, type VergeFit } from './tiles-per-course';
import { ENGINE_VERSION } from './version';

const r1 = (v: number) => Math.round(v * 10) / 10;
const r2 = (v: number) => Math.round(v * 100) / 100;
/** Down to 0.1 mm: a gauge shown rounded up could read above the maximum gauge and open the lap. */
const down1 = (v: number) => Math.floor(v * 10 + 1e-6) / 10;

/**
 * Order quantity with waste: ceil(net × (1 + waste % ÷ 100)). Rounded to 1e-6 first so that 1000 at
 * 5 % gives 1050, not 1051 from floating-point noise.
 */
export function orderQuantity(net: number, wastePct: number): number {
  if (net <= 0) return 0;
  const raw = (net * (100 + wastePct)) / 100;
  return Math.ceil(Math.round(raw * 1e6) / 1e6);
}

/** Thrown by estimate() when a face cannot be laid with the system; callers should check first. */
export class ScheduleRejectedError extends Error {
  readonly problems: InputProblem[];
  constructor(problems: InputProblem[]) {
    super(`the schedule cannot be estimated: ${problems.map((p) => p.message).join('; ')}`);
    this.name = 'ScheduleRejectedError';
    this.problems = problems;
  }
}

/**
 * Problems of checked faces against a system: a pitch below the tile's lowest band. `rowOf` turns a
 * face's index into the row number to report.
 */
export function checkFacesAgainstSystem(faces: readonly Face[], system: RoofSystem, rowOf: (index: number) => number = (i) => i + 1): InputProblem[] {
  const low = lowestPitch(system.tile.headlap_mm);
  const problems: InputProblem[] = [];
  faces.forEach((f, i) => {
    if (f.pitch_deg < low - 1e-9) {
      problems.push({ row: rowOf(i), column: 'pitch_deg', message: belowPitchMessage(f.pitch_deg, low) });
    }
  });
  return problems;
}

export function belowPitchMessage(pitch: number, low: number): string {
  return `${pitch}° is below the lowest pitch this tile may be laid at (${low}°)`;
}

/** 1st, 2nd, 3rd, 4th … 11th, 12th, 13th, 21st. */
function ordinal(n: number): string {
  const teen = n % 100 >= 11 && n % 100 <= 13;
  const suffix = teen ? 'th' : n % 10 === 1 ? 'st' : n % 10 === 2 ? 'nd' : n % 10 === 3 ? 'rd' : 'th';
  return `${n}${suffix}`;
}

/** A warning (a class for the reason FaceFigures is one: a big job has hundreds). */
class Notice implements EngineWarning {
  declare code: string;
  declare building: string | null;
  declare face: string | null;
  declare message: string;
  constructor(code: string, building: string | null, face: string | null, message: string) {
    this.code = code;
    this.building = building;
    this.face = face;
    this.message = message;
  }
}

function warnBuilding(warnings: EngineWarning[], building: string, code: string, message: string) {
  warnings.push(new Notice(code, building, null, message));
}

function warnFace(warnings: EngineWarning[], face: Face, code: string, message: string) {
  warnings.push(new Notice(code, face.building, face.face, message));
}

/** Objects reused from face to face so a 10,000-face job does not allocate per course. */
interface Scratch {
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
function applyOpenings(openings: readonly Opening[] | undefined, gaugeMm: number, coverMm: number, counts: { whole: number; cut: number; removed: number; batten_mm: number; area_mm2: number }, scratch: Scratch) {
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
function countVergeCourses(fit: VergeFit, C: number, system: RoofSystem, everyTileClipped: boolean, scratch: Scratch) {
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
function countRakingCourses(shape: FaceShape, setOut: CourseSetOut, oneVerge: boolean, overhang: number, system: RoofSystem, everyTileClipped: boolean, scratch: Scratch) {
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

/**
 * One face's figures. Built by a constructor, not an object literal: V8 moves objects from a literal
 * whose copies all outlive a young-generation collection straight into the old generation from then
 * on, and a big job's results would then stay in memory until the next full collection (DEVELOPERS.md,
 * decision 31). Its fields, their order and its JSON are those of FaceResult.
 */
class FaceFigures implements FaceResult {
  declare building: string;
  declare face: string;
  declare quantity: number;
  declare pitch_deg: number;
  declare rafter_mm: number;
  declare slope_area_m2: number;
  declare headlap_mm: number;
  declare gauge_mm: number;
  declare courses: number;
  declare tiles_per_course: number;
  declare cover_width_mm: number;
  declare verge_overhang_mm: number | null;
  declare whole_tiles: number;
  declare half_tiles: number;
  declare cut_tiles: number;
  declare tiles: number;
  declare eaves_tiles: number;
  declare top_tiles: number;
  declare tile_and_half: number;
  declare openings_area_m2: number;
  declare ridge: string | null;
  declare batten_m: number;
  declare stacks: number;
  declare stack_positions: number;
  declare load_kg: number;
  declare clips: number;
  declare setting_out_marks_mm: number[];
  declare setting_out_from: SettingOutFrom;
  declare stacks_by_row: number[];

  constructor(
    building: string,
    face: string,
    quantity: number,
    pitch_deg: number,
    rafter_mm: number,
    slope_area_m2: number,
    headlap_mm: number,
    gauge_mm: number,
    courses: number,
    tiles_per_course: number,
    cover_width_mm: number,
    verge_overhang_mm: number | null,
    whole_tiles: number,
    half_tiles: number,
    cut_tiles: number,
    tiles: number,
    eaves_tiles: number,
    top_tiles: number,
    tile_and_half: number,
    openings_area_m2: number,
    ridge: string | null,
    batten_m: number,
    stacks: number,
    stack_positions: number,
    load_kg: number,
    clips: number,
    setting_out_marks_mm: number[],
    setting_out_from: SettingOutFrom,
    stacks_by_row: number[],
  ) {
    this.building = building;
    this.face = face;
    this.quantity = quantity;
    this.pitch_deg = pitch_deg;
    this.rafter_mm = rafter_mm;
    this.slope_area_m2 = slope_area_m2;
    this.headlap_mm = headlap_mm;
    this.gauge_mm = gauge_mm;
    this.courses = courses;
    this.tiles_per_course = tiles_per_course;
    this.cover_width_mm = cover_width_mm;
    this.verge_overhang_mm = verge_overhang_mm;
    this.whole_tiles = whole_tiles;
    this.half_tiles = half_tiles;
    this.cut_tiles = cut_tiles;
    this.tiles = tiles;
    this.eaves_tiles = eaves_tiles;
    this.top_tiles = top_tiles;
    this.tile_and_half = tile_and_half;
    this.openings_area_m2 = openings_area_m2;
    this.ridge = ridge;
    this.batten_m = batten_m;
    this.stacks = stacks;
    this.stack_positions = stack_positions;
    this.load_kg = load_kg;
    this.clips = clips;
    this.setting_out_marks_mm = setting_out_marks_mm;
    this.setting_out_from = setting_out_from;
    this.stacks_by_row = stacks_by_row;
  }
}

function computeFace(face: Face, system: RoofSystem, tally: PieceTally, warnings: EngineWarning[], scratch: Scratch, openings?: readonly Opening[]): FaceResult {
  const { tile, setting_out: so } = system;
  const shape: FaceShape = face;
  const inset = insets(shape, scratch.inset);
  const setOut = setOutCourses(face.rafter_mm, face.pitch_deg, system, scratch.setOut);
  if (!setOut) throw new ScheduleRejectedError([{ message: belowPitchMessage(face.pitch_deg, lowestPitch(tile.headlap_mm)) }]);
  if (setOut.tiny) {
    warnFace(
      warnings,
      face,
      'tiny_face',
      `the face is too short for a first and a top batten (${Math.round(face.rafter_mm)} mm up the slope); counted as ${setOut.courses === 1 ? 'one course on one batten row' : 'the eaves course and one course, on two batten rows'}`,
    );
  }

  if (face.top_assumed) {
    warnFace(
      warnings,
      face,
      'top_assumed',
      `no top_mm on a face with a hip or valley edge: its top was taken as its eaves (${Math.round(face.eaves_mm)} mm), which overstates a hip end and understates a valley face; give top_mm in a new version of the schedule`,
    );
  }

  const C = setOut.courses;
  const leftVerge = !isRaking(face.left);
  const rightVerge = !isRaking(face.right);
  const cover = tile.cover_width_mm;
  const pieces = scratch.pieces;
  pieces.whole = 0;
  pieces.halves = 0;
  pieces.cut = 0;
  pieces.eaves = 0;
  pieces.top = 0;
  pieces.tah = 0;
  let nailed: number;
  let clips: number;
  const everyTileClipped = clipsEveryTile(scratch.clips, face.pitch_deg);
  let tilesPerCourse: number;
  let coverUsed = cover.nominal;
  let overhangUsed: number | null;
  let marksTiles: number;
  let marksOverhang: number;

  if (leftVerge && rightVerge) {
    const fit = fitBetweenVerges(face.eaves_mm, tile.width_mm, cover, so.verge_overhang_mm, scratch.fit);
    if (!fit.fits) {
      warnFace(warnings, face, 'no_whole_tile_fit', `no whole number of tiles fits ${Math.round(face.eaves_mm)} mm between the verges within the side-lock play and the verge overhang; one tile a course is cut`);
    }
    countVergeCourses(fit, C, system, everyTileClipped, scratch);
    nailed = scratch.nailed;
    clips = scratch.clipped;
    tilesPerCourse = fit.tiles;
    coverUsed = fit.cover_mm;
    overhangUsed = fit.overhang_mm;
    marksTiles = fit.tiles;
    marksOverhang = fit.overhang_mm;
  } else {
    const oneVerge = leftVerge || rightVerge;
    const overhang = so.verge_overhang_mm.target;
    countRakingCourses(shape, setOut, oneVerge, overhang, system, everyTileClipped, scratch);
    nailed = scratch.nailed;
    clips = scratch.clipped;
    tilesPerCourse = scratch.tilesPerCourse;
    const widest = scratch.widest;
    overhangUsed = oneVerge ? overhang : null;
    marksOverhang = oneVerge ? overhang : 0;
    marksTiles = tilesToSpan(widest + marksOverhang, tile.width_mm, cover.nominal);
  }
  let whole = pieces.whole;
  let cut = pieces.cut;
  const halves = pieces.halves;
  const eavesTiles = pieces.eaves;
  const topTiles = pieces.top;
  const tah = pieces.tah;
  const counts = scratch.counts;
  counts.whole = whole;
  counts.cut = cut;
  counts.removed = 0;
  counts.batten_mm = 0;
  counts.area_mm2 = 0;
  scratch.flashings.side = 0;
  scratch.flashings.top = 0;
  scratch.flashings.apron = 0;
  scratch.flashings.back = 0;
  scratch.roof_windows = 0;
  scratch.hatches = 0;
  applyOpenings(openings, setOut.gauge_mm > 0 ? setOut.gauge_mm : setOut.max_gauge_mm, coverUsed, counts, scratch);
  whole = counts.whole;
  cut = counts.cut;
  if (counts.removed > 0) {
    // Left-out tiles are not nailed (under the perimeter rule about every second one is), nor clipped.
    nailed = Math.max(0, nailed - (system.fixing.rule === 'every_tile' ? counts.removed : Math.ceil(counts.removed / 2)));
    if (everyTileClipped) clips = Math.max(0, clips - counts.removed);
  }
  if (face.left === 'abutment') scratch.flashings.side += rakingEdgeLength(face.rafter_mm, inset.left);
  if (face.right === 'abutment') scratch.flashings.side += rakingEdgeLength(face.rafter_mm, inset.right);
  if (face.top === 'abutment') scratch.flashings.top += face.top_mm;
  const tiles = whole + cut + tilesForHalves(halves, tile.halves_per_tile);

  if (system.fixing.rule === 'perimeter_and_alternate_courses' && face.pitch_deg >= EVERY_TILE_PITCH_DEG) {
    warnFace(
      warnings,
      face,
      'fixing_rule_pitch',
      `at ${face.pitch_deg}° (45° and above) every tile is normally nailed; the perimeter-and-alternate-courses rule was applied as set: check the tile maker's fixing specification`,
    );
  }

  if (tile.kind === 'single_lap' && face.pitch_deg >= EVERY_TILE_CLIP_PITCH_DEG && !everyTileClipped) {
    warnFace(
      warnings,
      face,
      'clip_rule_pitch',
      `at ${face.pitch_deg}° (55° and above) the tail of every tile is normally clipped as well as nailed; the clip rule was applied as set: check the tile maker's fixing specification`,
    );
  }

  const battens = planFaceBattens(shape, inset, setOut, system, tally, face.quantity, false, scratch.joints, scratch.supportsByRow, scratch.battens);
  if (battens.stagger_relaxed > 0) {
    warnFace(warnings, face, 'batten_joints_not_staggered', `${battens.stagger_relaxed} batten joint(s) could not be staggered from the three rows below; check the cutting on site`);
  }
  if (battens.forced_short > 0) {
    warnFace(warnings, face, 'short_batten', `${battens.forced_short} batten piece(s) had to be shorter than the minimum length or rafter count`);
  }

  // Stacks stand over the rafters each loading batten crosses, every nth batten from the top down.
  const rowPositions = scratch.rowPositions;
  let loadingRows = 0;
  for (let r = C - 1, k = Math.floor(C / system.roof_loading.every_nth_batten); k > 0; r -= system.roof_loading.every_nth_batten, k--) {
    rowPositions[loadingRows++] = scratch.supportsByRow[r];
  }
  const loading = planFaceLoading(tiles + eavesTiles + topTiles + tah, rowPositions, system.roof_loading.stack_size, loadingRows, scratch.loading);
  if (loading.needed_stack !== null) {
    warnFace(
      warnings,
      face,
      'too_few_stack_positions',
      loading.positions === 0
        ? `no loading battens on this face (${C} course(s), stacks on every ${ordinal(system.roof_loading.every_nth_batten)} batten): hand its ${tiles} tiles up from a neighbouring face`
        : `${loading.stacks} stacks of ${system.roof_loading.stack_size} need more than the ${loading.positions} positions; stacks of ${loading.needed_stack} would be needed: check with the roof's designer before loading more than usual`,
    );
  }

  const slope = Math.max(0, slopeAreaM2(shape) - counts.area_mm2 * 1e-6);
  const battenMm = Math.max(0, battens.batten_mm - counts.batten_mm);
  const reference = settingOutReference(face.left, face.right);
  const result = new FaceFigures(
    face.building,
    face.face,
    face.quantity,
    face.pitch_deg,
    r1(face.rafter_mm),
    r2(slope),
    setOut.headlap_mm,
    down1(setOut.gauge_mm),
    C,
    tilesPerCourse,
    r1(coverUsed),
    overhangUsed === null ? null : r1(overhangUsed),
    whole,
    halves,
    cut,
    tiles,
    eavesTiles,
    topTiles,
    tah,
    r2(counts.area_mm2 * 1e-6),
    face.ridge ?? null,
    r2(battenMm / 1000),
    loading.stacks,
    loading.positions,
    r1(tiles * tile.weight_kg + eavesTiles * tile.eaves_tile_kg + topTiles * tile.top_tile_kg + tah * tile.tile_and_half_kg),
    clips,
    settingOutMarks(marksTiles, coverUsed, marksOverhang),
    reference,
    loading.stacks_by_row,
  );
  scratch.plan_m2 = planAreaM2(slope, face.pitch_deg);
  scratch.net_slope_m2 = slope;
  scratch.openings_m2 = counts.area_mm2 * 1e-6;
  scratch.batten_mm = battenMm;
  scratch.batten_nails = battenNails(battens.crossings, battens.joints);
  scratch.tile_nails = nailed * tile.nails_per_tile;
  return result;
}

/**
 * The openings of each face by its index in the schedule, in the order given (undefined for a face
 * with none): through `faceOf` when the reader found each opening's face, else by building and face
 * name compared without case, every face of that name getting them.
 */
function openingsByFace(openings: readonly Opening[], schedule: Schedule, faceOf: readonly number[] | null): Array<Opening[] | undefined> {
  const byFace = new Array<Opening[] | undefined>(schedule.length);
  if (faceOf !== null) {
    for (let k = 0; k < openings.length; k++) {
      const list = byFace[faceOf[k]];
      if (list) list.push(openings[k]);
      else byFace[faceOf[k]] = [openings[k]];
    }
    return byFace;
  }
  const lookup = new FaceLookup<Opening[]>();
  for (const o of openings) {
    const list = lookup.get(o.building, o.face);
    if (list) list.push(o);
    else lookup.set(o.building, o.face, [o]);
  }
  for (let i = 0; i < schedule.length; i++) byFace[i] = lookup.get(schedule[i].building, schedule[i].face);
  return byFace;
}

/**
 * The take-off and loading estimate of a checked schedule with a resolved roof system, and the
 * openings in its faces (each in every copy of its face): per-face figures in schedule order, job
 * totals (faces × quantity), the pallet list, lorry loads, the load of each ridge and warnings.
 * Lengths in mm (m in totals), areas m², weights kg. Throws ScheduleRejectedError if a face's pitch is
 * below the tile's lowest band or an opening does not fit its face (check with checkFacesAgainstSystem
 * and checkOpeningsAgainstFaces, or use runEstimate / runEstimateFromCsv, which return errors instead).
 */
export function estimate(schedule: Schedule, system: RoofSystem, openings: readonly Opening[] = []): EngineResult {
  const problems = checkFacesAgainstSystem(schedule, system);
  if (openings.length > 0) {
    for (const p of checkOpeningsAgainstFaces(openings, schedule)) problems.push({ row: p.index + 1, column: p.column, message: p.message });
  }
  if (problems.length > 0) throw new ScheduleRejectedError(problems);
  return estimateChecked(schedule, system, openings);
}

/** Faces of one building: its ridge, hip and valley edges, and the faces that meet a ridge. */
interface BuildingFaces {
  name: string;
  edges: BuildingEdgeTally;
  ridgeFaces: number[];
}

/**
 * Running totals of a job, face by face (a face's figures times its quantity), kept in fields of one
 * object so the loop over a big schedule stays small and allocates nothing per face.
 */
class JobTally {
  slope = 0;
  plan = 0;
  tiles = 0;
  halfTiles = 0;
  cutTiles = 0;
  eavesTiles = 0;
  topTiles = 0;
  tahTiles = 0;
  openingsArea = 0;
  roofWindows = 0;
  hatches = 0;
  flashSide = 0;
  flashTop = 0;
  flashApron = 0;
  flashBack = 0;
  vergeMm = 0;
  eavesMm = 0;
  dryVergeUnits = 0;
  /** Ridge ends at a verge, each counted by both faces of a ridge (halved at the end). */
  capEnds = 0;
  hipEdges = 0;
  valleyUnitEdges = 0;
  battenM = 0;
  battenNailCount = 0;
  tileNailCount = 0;
  clipCount = 0;
  ridgeMm = 0;
  hipMm = 0;
  valleyMm = 0;
  ridgeTiles = 0;
  hipTiles = 0;
  readonly buildings: BuildingFaces[] = [];
  private readonly byBuilding = new Map<string, BuildingFaces>();
  private last: BuildingFaces | null = null;
  private readonly dryVerges: boolean;
  private readonly troughValleys: boolean;
  private readonly troughCover: number;

  constructor(system: RoofSystem) {
    this.dryVerges = system.verge.kind === 'dry';
    this.troughValleys = system.valley.kind === 'trough';
    this.troughCover = system.valley.unit_length_mm - system.valley.lap_mm;
  }

  add(face: Face, f: FaceResult, scratch: Scratch, i: number) {
    const q = face.quantity;
    // Totals come from the unrounded areas and lengths, so rounding a face never shifts the job.
    this.slope += scratch.net_slope_m2 * q;
    this.plan += scratch.plan_m2 * q;
    this.tiles += f.tiles * q;
    this.halfTiles += f.half_tiles * q;
    this.cutTiles += f.cut_tiles * q;
    this.eavesTiles += f.eaves_tiles * q;
    this.topTiles += f.top_tiles * q;
    this.tahTiles += f.tile_and_half * q;
    this.openingsArea += scratch.openings_m2 * q;
    this.roofWindows += scratch.roof_windows * q;
    this.hatches += scratch.hatches * q;
    this.flashSide += scratch.flashings.side * q;
    this.flashTop += scratch.flashings.top * q;
    this.flashApron += scratch.flashings.apron * q;
    this.flashBack += scratch.flashings.back * q;
    this.battenM += (scratch.batten_mm / 1000) * q;
    this.battenNailCount += scratch.batten_nails * q;
    this.tileNailCount += scratch.tile_nails * q;
    this.clipCount += f.clips * q;

    // Fittings: a verge is square to the eaves, so its raking length is the rafter.
    const vergeEdges = (face.left === 'verge' ? 1 : 0) + (face.right === 'verge' ? 1 : 0);
    this.vergeMm += vergeEdges * face.rafter_mm * q;
    this.eavesMm += face.eaves_mm * q;
    if (this.dryVerges) {
      this.dryVergeUnits += f.courses * vergeEdges * q;
      // Both faces of a ridge see each of its ends; a mono ridge's ends are its face's alone.
      if (face.top === 'ridge') this.capEnds += vergeEdges * q;
      else if (face.top === 'mono_ridge') this.capEnds += 2 * vergeEdges * q;
    }
    this.hipEdges += ((face.left === 'hip' ? 1 : 0) + (face.right === 'hip' ? 1 : 0)) * q;
    if (this.troughValleys) {
      if (face.left === 'valley') this.valleyUnitEdges += Math.ceil(rakingEdgeLength(face.rafter_mm, scratch.inset.left) / this.troughCover - 1e-9) * q;
      if (face.right === 'valley') this.valleyUnitEdges += Math.ceil(rakingEdgeLength(face.rafter_mm, scratch.inset.right) / this.troughCover - 1e-9) * q;
    }

    const b = this.building(face.building);
    b.edges.addFace(q, face.rafter_mm, face.top_mm, face.top, face.left, face.right, scratch.inset.left, scratch.inset.right);
    if (face.top === 'ridge' || (face.top === 'mono_ridge' && face.ridge !== undefined)) b.ridgeFaces.push(i);
  }

  /** The building's tally, in the order buildings first appear; faces of one building usually follow each other. */
  private building(name: string): BuildingFaces {
    const last = this.last;
    if (last !== null && last.name === name) return last;
    let b = this.byBuilding.get(name);
    if (!b) {
      b = { name, edges: new BuildingEdgeTally(), ridgeFaces: [] };
      this.byBuilding.set(name, b);
      this.buildings.push(b);
    }
    this.last = b;
    return b;
  }
}

function checkBalance(warnings: EngineWarning[], building: string, ridge: RidgeBalance) {
  let heavier = -Infinity;
  for (const kg of ridge.load_kg) if (kg > heavier) heavier = kg;
  if (heavier > 0 && ridge.difference_kg > RIDGE_BALANCE_TOLERANCE * heavier) {
    const named = ridge.ridge === null ? '' : `ridge ${ridge.ridge}: `;
    warnBuilding(
      warnings,
      building,
      'uneven_ridge_load',
      `${named}faces ${ridge.faces.join(', ')} carry ${ridge.load_kg.join(', ')} kg: load the slopes in step and finish the lighter one early, so the roof is never loaded on one side`,
    );
  }
}

/**
 * Faces of one building grouped by the ridge they name, reused from building to building: `members`
 * holds the faces' indices group by group (each in schedule order), `start` and `count` say where each
 * group is; groups are in the order their names first appear. `guessed` counts faces naming no ridge.
 */
interface RidgeGroups {
  members: number[];
  start: number[];
  count: number[];
  groupOf: number[];
  names: string[];
  guessed: number;
}

function newRidgeGroups(): RidgeGroups {
  return { members: [], start: [], count: [], groupOf: [], names: [], guessed: 0 };
}

/** True for a name of ASCII characters with no space at either end: trim() keeps it and toLowerCase() keeps its length. */
function isPlainAscii(s: string): boolean {
  const n = s.length;
  if (n === 0 || s.charCodeAt(0) <= 32 || s.charCodeAt(n - 1) <= 32) return false;
  for (let i = 0; i < n; i++) if (s.charCodeAt(i) >= 128) return false;
  return true;
}

/** a.trim().toLowerCase() === b.trim().toLowerCase(), without building the strings for plain ASCII names. */
export function sameNameWithoutCase(a: string, b: string): boolean {
  if (a === b) return true;
  if (!isPlainAscii(a) || !isPlainAscii(b)) return a.trim().toLowerCase() === b.trim().toLowerCase();
  const n = a.length;
  if (n !== b.length) return false;
  for (let i = 0; i < n; i++) {
    let x = a.charCodeAt(i);
    let y = b.charCodeAt(i);
    if (x >= 65 && x <= 90) x += 32;
    if (y >= 65 && y <= 90) y += 32;
    if (x !== y) return false;
  }
  return true;
}

/** Past this many ridges in one building, names are found through a map instead of one by one. */
const RIDGE_GROUPS_SCANNED = 16;

/** Groups a building's ridge faces by ridge name (without case) into `out`; returns the number of groups. */
function groupRidgeFaces(ridgeFaces: readonly number[], schedule: Schedule, out: RidgeGroups): number {
  const { groupOf, names, count, start, members } = out;
  let groups = 0;
  let guessed = 0;
  let byKey: Map<string, number> | null = null;
  for (let k = 0; k < ridgeFaces.length; k++) {
    const ridge = schedule[ridgeFaces[k]].ridge;
    if (ridge === undefined) {
      groupOf[k] = -1;
      guessed++;
      continue;
    }
    let g = -1;
    if (byKey !== null) g = byKey.get(ridge.trim().toLowerCase()) ?? -1;
    else {
      for (let j = 0; j < groups; j++) {
        if (sameNameWithoutCase(names[j], ridge)) {
          g = j;
          break;
        }
      }
    }
    if (g < 0) {
      g = groups++;
      names[g] = ridge;
      count[g] = 0;
      if (byKey !== null) byKey.set(ridge.trim().toLowerCase(), g);
      else if (groups > RIDGE_GROUPS_SCANNED) {
        byKey = new Map();
        for (let j = 0; j < groups; j++) byKey.set(names[j].trim().toLowerCase(), j);
      }
    }
    groupOf[k] = g;
    count[g]++;
  }
  // Members group by group, each group in schedule order (a counting sort).
  let at = 0;
  for (let g = 0; g < groups; g++) {
    start[g] = at;
    at += count[g];
  }
  for (let g = 0; g < groups; g++) count[g] = 0;
  for (let k = 0; k < ridgeFaces.length; k++) {
    const g = groupOf[k];
    if (g < 0) continue;
    members[start[g] + count[g]++] = ridgeFaces[k];
  }
  out.guessed = guessed;
  return groups;
}

/** One building's ridge, hip and valley lengths and tiles (into the tally), its ridges and their warnings. */
function finishBuilding(b: BuildingFaces, schedule: Schedule, faces: readonly FaceResult[], system: RoofSystem, job: JobTally, ridges: RidgeBalance[], warnings: EngineWarning[], scratch: RidgeGroups) {
  const building = b.name;
  const edges = b.edges.finish(system.ridge.cover_mm, system.hip.cover_mm);
  job.ridgeMm += edges.ridge_mm;
  job.hipMm += edges.hip_mm;
  job.valleyMm += edges.valley_mm;
  job.ridgeTiles += edges.ridge_tiles;
  job.hipTiles += edges.hip_tiles;
  if (edges.hip_edges % 2 === 1) {
    warnBuilding(warnings, building, 'odd_hip_edges', `${edges.hip_edges} hip edges: a hip is shared by two faces, so one hip is counted at half its length; check the schedule`);
  }
  if (edges.valley_edges % 2 === 1) {
    warnBuilding(warnings, building, 'odd_valley_edges', `${edges.valley_edges} valley edges: a valley is shared by two faces, so one valley is counted at half its length; check the schedule`);
  }
  if (edges.mixed_quantity) {
    warnBuilding(
      warnings,
      building,
      'mixed_quantity',
      'faces of this building have different quantities: ridge and hip tiles are rounded up for each group of faces with the same quantity; check that both slopes of each ridge have the same quantity',
    );
  }
  // Faces naming their ridge are grouped by the name (without case); the others are paired by top length.
  const groups = groupRidgeFaces(b.ridgeFaces, schedule, scratch);
  for (let g = 0; g < groups; g++) {
    const first = schedule[scratch.members[scratch.start[g]]];
    const name = (first.ridge as string).trim();
    const ridge = namedRidge(building, name, scratch.members, scratch.start[g], scratch.count[g], schedule, faces);
    ridges.push(ridge);
    if (scratch.count[g] === 1 && first.top_mm > 0 && first.top !== 'mono_ridge') {
      warnings.push(new Notice('unpaired_ridge_face', building, first.face, `no other face names ridge ${name}: the ridge is counted at half this face's top edge; check the schedule`));
    }
    checkBalance(warnings, building, ridge);
  }
  if (scratch.guessed === 0) return;
  const guessed: RidgeSide[] = [];
  for (const i of b.ridgeFaces) {
    const face = schedule[i];
    if (face.ridge === undefined) guessed.push({ building, face: face.face, top_mm: face.top_mm, load_kg: faces[i].load_kg });
  }
  if (guessed.length > 0) {
    warnBuilding(warnings, building, 'ridge_grouping_guessed', `${guessed.length} face(s) meeting a ridge name no ridge: they were paired by equal top length, which can hide an uneven load; give the ridge column`);
  }
  const paired = pairRidgeFaces(guessed);
  for (const pair of paired.pairs) {
    ridges.push(pair);
    checkBalance(warnings, building, pair);
  }
  for (const side of paired.unpaired) {
    if (side.top_mm === 0) continue; // a lone hip end touches the ridge at one point only
    warnings.push({
      code: 'unpaired_ridge_face',
      building,
      face: side.face,
      message: `no face with the same ridge length (${Math.round(side.top_mm)} mm) on the other slope: the ridge is counted at half this face's top edge; check the schedule`,
    });
  }
}

/**
 * estimate() for a schedule and openings already checked (the CSV pipeline checks them as it reads
 * them, and gives the index of each opening's face in `faceOf`).
 */
function estimateChecked(schedule: Schedule, system: RoofSystem, openings: readonly Opening[], faceOf: readonly number[] | null = null): EngineResult {
  const openingsOf = openings.length > 0 ? openingsByFace(openings, schedule, faceOf) : null;

  const warnings: EngineWarning[] = [];
  const tally = new PieceTally(system.batten.stock_length_mm);
  const scratch: Scratch = {
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
  };
  const faces: FaceResult[] = new Array<FaceResult>(schedule.length);
  const job = new JobTally(system);
  for (let i = 0; i < schedule.length; i++) {
    const face = schedule[i];
    const f = computeFace(face, system, tally, warnings, scratch, openingsOf === null ? undefined : openingsOf[i]);
    faces[i] = f;
    job.add(face, f, scratch, i);
  }

  const ridges: RidgeBalance[] = [];
  const groups = newRidgeGroups();
  for (const b of job.buildings) finishBuilding(b, schedule, faces, system, job, ridges, warnings, groups);
  return finishJob(faces, system, tally, job, ridges, warnings);
}

/** Orders with waste, the delivery plan and the job's totals. */
function finishJob(faces: FaceResult[], system: RoofSystem, tally: PieceTally, job: JobTally, ridges: RidgeBalance[], warnings: EngineWarning[]): EngineResult {
  const { slope, plan, tiles, halfTiles, cutTiles, eavesTiles, topTiles, tahTiles, openingsArea, roofWindows, hatches } = job;
  const { vergeMm, eavesMm, dryVergeUnits, capEnds, hipEdges, valleyUnitEdges, battenM, battenNailCount, tileNailCount, clipCount } = job;
  const { ridgeMm, hipMm, valleyMm, ridgeTiles, hipTiles } = job;
  const flashMm = { side: job.flashSide, top: job.flashTop, apron: job.flashApron, back: job.flashBack };
  const waste = system.waste_pct;
  const tilesOrder = orderQuantity(tiles, waste.tiles);
  const eavesOrder = orderQuantity(eavesTiles, waste.tiles);
  const topOrder = orderQuantity(topTiles, waste.tiles);
  const tahOrder = orderQuantity(tahTiles, waste.tiles);
  const stock = planStockLengths(tally, system.batten.stock_length_mm);
  // Waste on the net metres first, then one rounding; never fewer than the cutting plan needs.
  const battenLengths = Math.max(stock.lengths, orderQuantity((battenM * 1000) / system.batten.stock_length_mm, waste.battens));
  const perRollM2 = ((system.underlay.roll_width_mm - system.underlay.head_lap_mm) * system.underlay.roll_length_mm) / 1e6;
  const underlayRolls = orderQuantity(slope / perRollM2, waste.underlay);
  const ridgeOrder = orderQuantity(ridgeTiles, waste.ridge_hip);
  const hipOrder = orderQuantity(hipTiles, waste.ridge_hip);
  const ridgeEndCaps = Math.ceil(capEnds / 2);
  const hipIrons = Math.ceil(hipEdges / 2);
  const valleyUnits = Math.ceil(valleyUnitEdges / 2);

  const delivery = planDelivery(
    {
      tilesOrdered: tilesOrder,
      faces,
      withTiles: [
        { item: 'eaves_tiles', quantity: eavesOrder, unit_kg: system.tile.eaves_tile_kg },
        { item: 'top_tiles', quantity: topOrder, unit_kg: system.tile.top_tile_kg },
        { item: 'tile_and_half', quantity: tahOrder, unit_kg: system.tile.tile_and_half_kg },
      ],
      firstOff: [
        { item: 'underlay_rolls', quantity: underlayRolls, unit_kg: system.underlay.roll_kg },
        { item: 'battens', quantity: battenLengths, unit_kg: (system.batten.kg_per_m * system.batten.stock_length_mm) / 1000 },
        { item: 'batten_nails', quantity: battenNailCount, unit_kg: system.fixing.batten_nail_g / 1000 },
        { item: 'tile_nails', quantity: tileNailCount, unit_kg: system.fixing.tile_nail_g / 1000 },
        { item: 'clips', quantity: clipCount, unit_kg: system.fixing.clip_g / 1000 },
        { item: 'valley_units', quantity: valleyUnits, unit_kg: system.valley.unit_kg },
        { item: 'hip_irons', quantity: hipIrons, unit_kg: system.hip.iron_kg },
        { item: 'dry_verge_units', quantity: dryVergeUnits, unit_kg: system.verge.unit_kg },
      ],
      lastOff: [
        { item: 'ridge_tiles', quantity: ridgeOrder, unit_kg: system.ridge.weight_kg },
        { item: 'hip_tiles', quantity: hipOrder, unit_kg: system.hip.weight_kg },
        { item: 'ridge_end_caps', quantity: ridgeEndCaps, unit_kg: system.verge.end_cap_kg },
      ],
    },
    system,
    MAX_DELIVERY_PALLETS,
  );
  for (const issue of delivery.issues) warnings.push(new Notice(issue.code, null, null, issue.message));

  const flashings: Flashings = {
    side_abutment_m: r2(flashMm.side / 1000),
    top_abutment_m: r2(flashMm.top / 1000),
    apron_m: r2(flashMm.apron / 1000),
    back_gutter_m: r2(flashMm.back / 1000),
  };

  return {
    engine_version: ENGINE_VERSION,
    faces,
    totals: {
      slope_area_m2: r2(slope),
      plan_area_m2: r2(plan),
      tiles,
      tiles_order: tilesOrder,
      half_tiles: halfTiles,
      cut_tiles: cutTiles,
      batten_m: r2(battenM),
      batten_lengths: battenLengths,
      batten_nails: battenNailCount,
      tile_nails: tileNailCount,
      clips: clipCount,
      ridge_m: r2(ridgeMm / 1000),
      ridge_tiles: ridgeOrder,
      hip_m: r2(hipMm / 1000),
      hip_tiles: hipOrder,
      valley_m: r2(valleyMm / 1000),
      underlay_rolls: underlayRolls,
      pallets: delivery.tile_pallets,
      weight_kg: r1(delivery.weight_kg),
      eaves_tiles: eavesTiles,
      top_tiles: topTiles,
      tile_and_half: tahTiles,
      eaves_tiles_order: eavesOrder,
      top_tiles_order: topOrder,
      tile_and_half_order: tahOrder,
      openings_area_m2: r2(openingsArea),
      roof_windows: roofWindows,
      hatches,
      flashings,
      verge_m: r2(vergeMm / 1000),
      eaves_m: r2(eavesMm / 1000),
      dry_verge_units: dryVergeUnits,
      ridge_end_caps: ridgeEndCaps,
      hip_irons: hipIrons,
      valley_units: valleyUnits,
    },
    pallets: delivery.pallets,
    loads: delivery.loads,
    ridges,
    warnings,
    cautions: SAFETY_CAUTIONS,
  };
}

/** One face in full, for a drawing of its battens, joints, stacks and chalk lines. */
export interface FaceDetail {
  face: FaceResult;
  /** Batten rows from the eaves up, with their pieces and joints. */
  battens: BattenRow[];
  /** Loading battens from the top down, with the rafters they cross and the stacks they carry. */
  loading: Array<{ batten: number; positions: number; stacks: number }>;
}

/**
 * Everything about one face that the job result leaves out to stay small: each batten row's pieces and
 * joints, and the stacks on each loading batten. Same rules and figures as estimate() (mm, kg).
 */
export function faceDetail(face: Face, system: RoofSystem, openings: readonly Opening[] = []): FaceDetail {
  const problems = checkFacesAgainstSystem([face], system);
  if (problems.length > 0) throw new ScheduleRejectedError(problems);
  const key = faceKey(face.building, face.face);
  const result = estimate(
    [face],
    system,
    openings.filter((o) => faceKey(o.building, o.face) === key),
  ).faces[0];
  const setOut = setOutCourses(face.rafter_mm, face.pitch_deg, system) as CourseSetOut;
  const plan = planFaceBattens(face, insets(face), setOut, system, null, 1, true);
  const rows = plan.rows ?? [];
  const indices = loadingRowIndices(setOut.courses, system.roof_loading.every_nth_batten);
  const positions = indices.map((r) => {
    const row = rows.find((b) => b.y_mm === rowHeight(setOut, r));
    return row ? row.supports : 0;
  });
  const placed = planFaceLoading(result.tiles + result.eaves_tiles + result.top_tiles + result.tile_and_half, positions, system.roof_loading.stack_size);
  return {
    face: result,
    battens: rows,
    loading: indices.map((r, i) => ({ batten: r + 1, positions: positions[i], stacks: placed.stacks_by_row[i] })),
  };
}

export type RunOutcome = { ok: true; result: EngineResult } | { ok: false; errors: InputProblem[] };

function withParseWarnings(result: EngineResult, parseWarnings: readonly ScheduleWarning[]): EngineResult {
  if (parseWarnings.length === 0) return result;
  return { ...result, warnings: [...parseWarnings, ...result.warnings] };
}

/**
 * The whole pipeline from CSV text: read the roof system (partial → full, errors naming the field),
 * read and check the schedule (errors naming row and column, every problem at once), read the
 * openings file when there is one (its errors marked `file: 'openings'`), estimate. A rejected input
 * gives errors and no result.
 */
export function runEstimateFromCsv(csvText: string, systemInput?: RoofSystemInput | unknown, openingsCsv?: string): RunOutcome {
  const sys = parseRoofSystem(systemInput ?? {});
  const read = readScheduleCsv(csvText, sys.ok ? sys.system : undefined);
  const parsed = read.parsed;
  const errors: InputProblem[] = [];
  if (!sys.ok) errors.push(...sys.errors);
  if (!parsed.ok) errors.push(...parsed.errors);
  let openings: Opening[] = [];
  let faceOf: readonly number[] | null = null;
  const openingWarnings: ScheduleWarning[] = [];
  if (openingsCsv !== undefined) {
    const read2 = readOpeningsCsv(openingsCsv, parsed.ok ? parsed.faces : undefined, read.index);
    const o = read2.parsed;
    if (!o.ok) errors.push(...o.errors.map((p) => ({ ...p, file: 'openings' as const })));
    else {
      openings = o.openings;
      faceOf = read2.faceOf;
      openingWarnings.push(...o.warnings);
    }
  }
  if (errors.length > 0 || !sys.ok || !parsed.ok) return { ok: false, errors };
  // The reader checked every pitch against the system and every opening against its face (and found its face's index).
  return { ok: true, result: withParseWarnings(estimateChecked(parsed.faces, sys.system, openings, faceOf), [...parsed.warnings, ...openingWarnings]) };
}

/**
 * The whole pipeline from a JSON schedule (an array of rows as scheduleRowSchema describes). Errors
 * give the entry number (from 1) as row, and the column.
 */
export function runEstimate(rows: unknown, systemInput?: RoofSystemInput | unknown, openingRows: unknown = []): RunOutcome {
  const sys = parseRoofSystem(systemInput ?? {});
  const errors: InputProblem[] = [];
  if (!sys.ok) errors.push(...sys.errors);
  const parsed = scheduleSchema.safeParse(rows);
  const openings = openingsSchema.safeParse(openingRows);
  if (!openings.success) {
    for (const issue of openings.error.issues) {
      const [index, column] = issue.path;
      errors.push({
        file: 'openings',
        ...(typeof index === 'number' ? { row: index + 1 } : {}),
        ...(typeof column === 'string' ? { column } : {}),
        message: issue.message,
      });
    }
  } else if (parsed.success) {
    for (const p of checkOpeningsAgainstFaces(openings.data, parsed.data)) {
      errors.push({ file: 'openings', row: p.index + 1, column: p.column, message: p.message });
    }
  }
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const [index, column] = issue.path;
      errors.push({
        ...(typeof index === 'number' ? { row: index + 1 } : {}),
        ...(typeof column === 'string' ? { column } : {}),
        message: issue.message,
      });
    }
  } else if (sys.ok) {
    errors.push(...checkFacesAgainstSystem(parsed.data, sys.system));
  }
  if (errors.length > 0 || !sys.ok || !parsed.success || !openings.success) return { ok: false, errors };
  return { ok: true, result: estimate(parsed.data, sys.system, openings.data) };
}

/** One line per problem, as the CLI and logs print it: `row 3, column eaves_mm: must be …`. */
export function formatProblem(p: InputProblem): string {
  const where: string[] = [];
  if (p.file === 'openings') where.push('openings file');
  if (p.row !== undefined) where.push(`row ${p.row}`);
  if (p.column !== undefined) where.push(`column ${p.column}`);
  if (p.field !== undefined) where.push(`system field ${p.field}`);
  return where.length > 0 ? `${where.join(', ')}: ${p.message}` : p.message;
}
