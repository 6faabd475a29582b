import type { Opening } from '../schemas/openings.schema';
import type { RoofSystem } from '../schemas/roof-system.schema';
import type { Face } from '../schemas/schedule.schema';
import { addLastFacePieces, planFaceBattens, type FaceBattens, type PieceTally } from './battens';
import { tilesForHalves } from './bond';
import { clipsEveryTile } from './clips';
import { lowestPitch, setOutCourses } from './courses';
import { EVERY_TILE_CLIP_PITCH_DEG, EVERY_TILE_PITCH_DEG } from './defaults';
import { applyOpenings, countRakingCourses, countVergeCourses, type Scratch } from './face-courses';
import { battenNails } from './fixings';
import { insets, isRaking, planAreaM2, rakingEdgeLength, slopeAreaM2, type FaceShape } from './geometry';
import { planFaceLoading } from './loading';
import { ScheduleRejectedError, belowPitchMessage, ordinal, warnFace } from './notices';
import type { EngineWarning, FaceResult } from './result';
import { down1, r1, r2 } from './round';
import { settingOutMarks, settingOutReference, type SettingOutFrom } from './setting-out';
import { fitBetweenVerges, tilesToSpan } from './tiles-per-course';

/** One face's figures (FaceResult): set-out, pieces, battens, loading and warnings, written from the face's counts. */

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

  /**
   * Every field in FaceResult's order, set to a placeholder and then written by computeFace: a decimal
   * given as an argument would be boxed once to pass it and again to store it.
   */
  constructor(building: string, face: string) {
    this.building = building;
    this.face = face;
    this.quantity = 0;
    this.pitch_deg = DECIMAL;
    this.rafter_mm = DECIMAL;
    this.slope_area_m2 = DECIMAL;
    this.headlap_mm = DECIMAL;
    this.gauge_mm = DECIMAL;
    this.courses = 0;
    this.tiles_per_course = 0;
    this.cover_width_mm = DECIMAL;
    this.verge_overhang_mm = null;
    this.whole_tiles = 0;
    this.half_tiles = 0;
    this.cut_tiles = 0;
    this.tiles = 0;
    this.eaves_tiles = 0;
    this.top_tiles = 0;
    this.tile_and_half = 0;
    this.openings_area_m2 = DECIMAL;
    this.ridge = null;
    this.batten_m = DECIMAL;
    this.stacks = 0;
    this.stack_positions = 0;
    this.load_kg = DECIMAL;
    this.clips = 0;
    this.setting_out_marks_mm = NO_NUMBERS;
    this.setting_out_from = 'right_end';
    this.stacks_by_row = NO_NUMBERS;
  }
}

/**
 * Placeholder of a field that may hold a decimal, until computeFace writes it (never part of a result).
 * A field that starts as a whole number and is then given a decimal is kept by V8 as a decimal field:
 * every face then holds its value in a box of its own (16 bytes), whole numbers too. A field that
 * starts as null is kept as a tagged field, where whole numbers (most rafters, covers, openings areas)
 * take no box: about 29,000 fewer boxes in the 10,000-face benchmark job.
 */
const DECIMAL = null as unknown as number;

/** Placeholder for a face's arrays until computeFace writes them (never part of a result). */
const NO_NUMBERS: number[] = [];

export function computeFace(face: Face, system: RoofSystem, tally: PieceTally, warnings: EngineWarning[], scratch: Scratch, openings?: readonly Opening[]): FaceResult {
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
  // A face of the same size, pitch and system as the face before it has the same courses if it has as
  // many verges (its mirror image too), and the same battens if its raking edges are set in as far.
  const verges = leftVerge ? (rightVerge ? 2 : 1) : rightVerge ? 1 : 0;
  const sameSize = scratch.lastSystem === system && scratch.lastPitch === face.pitch_deg && scratch.lastRafter === face.rafter_mm && scratch.lastEaves === face.eaves_mm;
  const sameCourses = sameSize && scratch.lastTop === face.top_mm && scratch.lastVerges === verges;
  const sameBattens = sameSize && scratch.lastInsetLeft === inset.left && scratch.lastInsetRight === inset.right;
  if (!sameCourses) {
    pieces.whole = 0;
    pieces.halves = 0;
    pieces.cut = 0;
    pieces.eaves = 0;
    pieces.top = 0;
    pieces.tah = 0;
  }
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
    if (!sameCourses) countVergeCourses(fit, C, system, everyTileClipped, scratch);
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
    if (!sameCourses) countRakingCourses(shape, setOut, oneVerge, overhang, system, everyTileClipped, scratch);
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

  let battens: FaceBattens;
  if (sameBattens) {
    addLastFacePieces(tally, face.quantity, scratch.joints);
    battens = scratch.battens;
  } else {
    battens = planFaceBattens(shape, inset, setOut, system, tally, face.quantity, false, scratch.joints, scratch.supportsByRow, scratch.battens);
  }
  scratch.lastSystem = system;
  scratch.lastPitch = face.pitch_deg;
  scratch.lastRafter = face.rafter_mm;
  scratch.lastEaves = face.eaves_mm;
  scratch.lastTop = face.top_mm;
  scratch.lastVerges = verges;
  scratch.lastInsetLeft = inset.left;
  scratch.lastInsetRight = inset.right;
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
  const result = new FaceFigures(face.building, face.face);
  result.quantity = face.quantity;
  result.pitch_deg = face.pitch_deg;
  result.rafter_mm = r1(face.rafter_mm);
  result.slope_area_m2 = r2(slope);
  result.headlap_mm = setOut.headlap_mm;
  result.gauge_mm = down1(setOut.gauge_mm);
  result.courses = C;
  result.tiles_per_course = tilesPerCourse;
  result.cover_width_mm = r1(coverUsed);
  result.verge_overhang_mm = overhangUsed === null ? null : r1(overhangUsed);
  result.whole_tiles = whole;
  result.half_tiles = halves;
  result.cut_tiles = cut;
  result.tiles = tiles;
  result.eaves_tiles = eavesTiles;
  result.top_tiles = topTiles;
  result.tile_and_half = tah;
  result.openings_area_m2 = r2(counts.area_mm2 * 1e-6);
  result.ridge = face.ridge ?? null;
  result.batten_m = r2(battenMm / 1000);
  result.stacks = loading.stacks;
  result.stack_positions = loading.positions;
  result.load_kg = r1(tiles * tile.weight_kg + eavesTiles * tile.eaves_tile_kg + topTiles * tile.top_tile_kg + tah * tile.tile_and_half_kg);
  result.clips = clips;
  let marks = scratch.lastMarks;
  if (marks === null || scratch.lastMarksTiles !== marksTiles || scratch.lastMarksCover !== coverUsed || scratch.lastMarksOverhang !== marksOverhang) {
    marks = settingOutMarks(marksTiles, coverUsed, marksOverhang);
    scratch.lastMarks = marks;
    scratch.lastMarksTiles = marksTiles;
    scratch.lastMarksCover = coverUsed;
    scratch.lastMarksOverhang = marksOverhang;
  }
  result.setting_out_marks_mm = marks;
  result.setting_out_from = reference;
  result.stacks_by_row = loading.stacks_by_row;
  scratch.plan_m2 = planAreaM2(slope, face.pitch_deg);
  scratch.net_slope_m2 = slope;
  scratch.openings_m2 = counts.area_mm2 * 1e-6;
  scratch.batten_mm = battenMm;
  scratch.batten_nails = battenNails(battens.crossings, battens.joints);
  scratch.tile_nails = nailed * tile.nails_per_tile;
  return result;
}
