import type { RoofSystem, RoofSystemInput } from '../schemas/roof-system.schema';
import { scheduleSchema, type Face, type Schedule } from '../schemas/schedule.schema';
import { JointScratch, PieceTally, planFaceBattens, planStockLengths, type BattenRow, type FaceBattens } from './battens';
import { isBrokenCourse, rakeToRakeCourse, tilesForHalves, vergeCourse, vergeToRakeCourse, type CoursePieces } from './bond';
import { clipRule, clipsEveryTile, courseClips, type ClipRule } from './clips';
import { lowestPitch, rowHeight, setOutCourses, type CourseSetOut } from './courses';
import {
  EVERY_TILE_CLIP_PITCH_DEG,
  EVERY_TILE_PITCH_DEG,
  MAX_DELIVERY_PALLETS,
  RIDGE_BALANCE_TOLERANCE,
  SAFETY_CAUTIONS,
} from './defaults';
import { planDelivery } from './delivery';
import { battenNails, nailedPieces } from './fixings';
import { insets, isRaking, planAreaM2, slopeAreaM2, widthAt, type FaceShape } from './geometry';
import { loadingRowIndices, pairRidgeFaces, planFaceLoading, type RidgeBalance, type RidgeSide } from './loading';
import { BuildingEdgeTally } from './ridge-hip';
import type { EngineResult, EngineWarning, FaceResult, InputProblem } from './result';
import { parseRoofSystem } from './roof-system';
import { parseScheduleCsv, type ScheduleWarning } from './schedule-parse';
import { settingOutMarks, settingOutReference } from './setting-out';
import { fitBetweenVerges, tilesToSpan } from './tiles-per-course';
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
export function checkFacesAgainstSystem(
  faces: readonly Face[],
  system: RoofSystem,
  rowOf: (index: number) => number = (i) => i + 1,
): InputProblem[] {
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

function warnBuilding(warnings: EngineWarning[], building: string, code: string, message: string) {
  warnings.push({ code, building, face: null, message });
}

function warnFace(warnings: EngineWarning[], face: Face, code: string, message: string) {
  warnings.push({ code, building: face.building, face: face.face, message });
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
  /** Figures of the face just computed that the totals need but the face result does not show. */
  plan_m2: number;
  batten_mm: number;
  batten_nails: number;
  tile_nails: number;
  inset: { left: number; right: number };
  clips: ClipRule;
}

function computeFace(face: Face, system: RoofSystem, tally: PieceTally, warnings: EngineWarning[], scratch: Scratch): FaceResult {
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

  const C = setOut.courses;
  const leftVerge = !isRaking(face.left);
  const rightVerge = !isRaking(face.right);
  const cover = tile.cover_width_mm;
  let whole = 0;
  let halves = 0;
  let cut = 0;
  let nailed = 0;
  let clips = 0;
  const everyTileClipped = clipsEveryTile(scratch.clips, face.pitch_deg);
  let tilesPerCourse = 0;
  let coverUsed = cover.nominal;
  let overhangUsed: number | null;
  let marksTiles: number;
  let marksOverhang: number;

  if (leftVerge && rightVerge) {
    const fit = fitBetweenVerges(face.eaves_mm, tile.width_mm, cover, so.verge_overhang_mm);
    if (!fit.fits) {
      warnFace(
        warnings,
        face,
        'no_whole_tile_fit',
        `no whole number of tiles fits ${Math.round(face.eaves_mm)} mm between the verges within the side-lock play and the verge overhang; one tile a course is cut`,
      );
    }
    const straight = vergeCourse(fit, false, scratch.course);
    const broken = vergeCourse(fit, true, scratch.brokenCourse);
    for (let i = 0; i < C; i++) {
      const course = isBrokenCourse(tile.bond, i) ? broken : straight;
      whole += course.whole;
      halves += course.halves;
      cut += course.cut;
      nailed += nailedPieces(system.fixing.rule, course, i, C);
      clips += courseClips(scratch.clips, course, i, 2, everyTileClipped);
    }
    tilesPerCourse = fit.tiles;
    coverUsed = fit.cover_mm;
    overhangUsed = fit.overhang_mm;
    marksTiles = fit.tiles;
    marksOverhang = fit.overhang_mm;
  } else {
    const oneVerge = leftVerge || rightVerge;
    const overhang = so.verge_overhang_mm.target;
    let widest = 0;
    for (let i = 0; i < C; i++) {
      const y = rowHeight(setOut, i);
      // A course must reach the raking edge over the whole tile, from its tail up to its batten.
      const width = Math.max(widthAt(shape, Math.max(0, y - tile.length_mm)), widthAt(shape, Math.min(face.rafter_mm, y)));
      if (width > widest) widest = width;
      const course: CoursePieces = oneVerge
        ? vergeToRakeCourse(width, overhang, tile.width_mm, cover.nominal, isBrokenCourse(tile.bond, i), scratch.course)
        : rakeToRakeCourse(width, tile.width_mm, cover.nominal, scratch.course);
      whole += course.whole;
      halves += course.halves;
      cut += course.cut;
      nailed += nailedPieces(system.fixing.rule, course, i, C);
      clips += courseClips(scratch.clips, course, i, oneVerge ? 1 : 0, everyTileClipped);
      const inCourse = Math.ceil(course.whole + course.cut + course.halves / 2);
      if (inCourse > tilesPerCourse) tilesPerCourse = inCourse;
    }
    overhangUsed = oneVerge ? overhang : null;
    marksOverhang = oneVerge ? overhang : 0;
    marksTiles = tilesToSpan(widest + marksOverhang, tile.width_mm, cover.nominal);
  }
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
    warnFace(
      warnings,
      face,
      'batten_joints_not_staggered',
      `${battens.stagger_relaxed} batten joint(s) could not be staggered from the three rows below; check the cutting on site`,
    );
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
  const loading = planFaceLoading(tiles, rowPositions, system.roof_loading.stack_size, loadingRows);
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

  const slope = slopeAreaM2(shape);
  const reference = settingOutReference(face.left, face.right);
  const result: FaceResult = {
    building: face.building,
    face: face.face,
    quantity: face.quantity,
    pitch_deg: face.pitch_deg,
    rafter_mm: r1(face.rafter_mm),
    slope_area_m2: r2(slope),
    headlap_mm: setOut.headlap_mm,
    gauge_mm: down1(setOut.gauge_mm),
    courses: C,
    tiles_per_course: tilesPerCourse,
    cover_width_mm: r1(coverUsed),
    verge_overhang_mm: overhangUsed === null ? null : r1(overhangUsed),
    whole_tiles: whole,
    half_tiles: halves,
    cut_tiles: cut,
    tiles,
    batten_m: r2(battens.batten_mm / 1000),
    stacks: loading.stacks,
    stack_positions: loading.positions,
    load_kg: r1(tiles * tile.weight_kg),
    clips,
    setting_out_marks_mm: settingOutMarks(marksTiles, coverUsed, marksOverhang),
    setting_out_from: reference,
    stacks_by_row: loading.stacks_by_row,
  };
  scratch.plan_m2 = planAreaM2(slope, face.pitch_deg);
  scratch.batten_mm = battens.batten_mm;
  scratch.batten_nails = battenNails(battens.crossings, battens.joints);
  scratch.tile_nails = nailed * tile.nails_per_tile;
  return result;
}

/**
 * The take-off and loading estimate of a checked schedule with a resolved roof system: per-face
 * figures in schedule order, job totals (faces × quantity), the pallet list, lorry loads, ridge load
 * balance and warnings. Lengths in mm (m in totals), areas m², weights kg. Throws
 * ScheduleRejectedError if a face's pitch is below the tile's lowest band (check with
 * checkFacesAgainstSystem, or use runEstimate / runEstimateFromCsv, which return errors instead).
 */
export function estimate(schedule: Schedule, system: RoofSystem): EngineResult {
  const problems = checkFacesAgainstSystem(schedule, system);
  if (problems.length > 0) throw new ScheduleRejectedError(problems);

  const warnings: EngineWarning[] = [];
  const tally = new PieceTally(system.batten.stock_length_mm);
  const scratch: Scratch = {
    joints: new JointScratch(),
    setOut: { headlap_mm: 0, max_gauge_mm: 0, gauge_mm: 0, gauges: 0, courses: 0, first_batten_mm: 0, top_batten_mm: 0, tiny: false, eaves_course: false },
    battens: { batten_mm: 0, crossings: 0, joints: 0, stagger_relaxed: 0, forced_short: 0 },
    course: { whole: 0, halves: 0, cut: 0, perimeter: 0 },
    brokenCourse: { whole: 0, halves: 0, cut: 0, perimeter: 0 },
    rowPositions: [],
    supportsByRow: [],
    plan_m2: 0,
    batten_mm: 0,
    batten_nails: 0,
    tile_nails: 0,
    inset: { left: 0, right: 0 },
    clips: clipRule(system),
  };
  const faces: FaceResult[] = [];
  const byBuilding = new Map<string, { edges: BuildingEdgeTally; ridgeFaces: number[] }>();

  let slope = 0;
  let plan = 0;
  let tiles = 0;
  let halfTiles = 0;
  let cutTiles = 0;
  let battenM = 0;
  let battenNailCount = 0;
  let tileNailCount = 0;
  let clipCount = 0;

  for (let i = 0; i < schedule.length; i++) {
    const face = schedule[i];
    const f = computeFace(face, system, tally, warnings, scratch);
    const q = face.quantity;
    faces.push(f);
    // Totals come from the unrounded areas and lengths, so rounding a face never shifts the job.
    slope += slopeAreaM2(face) * q;
    plan += scratch.plan_m2 * q;
    tiles += f.tiles * q;
    halfTiles += f.half_tiles * q;
    cutTiles += f.cut_tiles * q;
    battenM += (scratch.batten_mm / 1000) * q;
    battenNailCount += scratch.batten_nails * q;
    tileNailCount += scratch.tile_nails * q;
    clipCount += f.clips * q;

    let b = byBuilding.get(face.building);
    if (!b) {
      b = { edges: new BuildingEdgeTally(), ridgeFaces: [] };
      byBuilding.set(face.building, b);
    }
    b.edges.addFace(q, face.rafter_mm, face.top_mm, face.top, face.left, face.right, scratch.inset.left, scratch.inset.right);
    if (face.top === 'ridge') b.ridgeFaces.push(i);
  }

  let ridgeMm = 0;
  let hipMm = 0;
  let valleyMm = 0;
  let ridgeTiles = 0;
  let hipTiles = 0;
  const ridges: RidgeBalance[] = [];
  for (const [building, b] of byBuilding) {
    const edges = b.edges.finish(system.ridge.cover_mm, system.hip.cover_mm);
    ridgeMm += edges.ridge_mm;
    hipMm += edges.hip_mm;
    valleyMm += edges.valley_mm;
    ridgeTiles += edges.ridge_tiles;
    hipTiles += edges.hip_tiles;
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
    const sides: RidgeSide[] = [];
    for (const i of b.ridgeFaces) {
      sides.push({ building, face: schedule[i].face, top_mm: schedule[i].top_mm, load_kg: faces[i].load_kg });
    }
    const paired = pairRidgeFaces(sides);
    for (const pair of paired.pairs) {
      ridges.push(pair);
      const heavier = Math.max(pair.load_kg[0], pair.load_kg[1]);
      if (heavier > 0 && pair.difference_kg > RIDGE_BALANCE_TOLERANCE * heavier) {
        warnBuilding(
          warnings,
          building,
          'uneven_ridge_load',
          `faces ${pair.faces[0]} and ${pair.faces[1]} carry ${pair.load_kg[0]} and ${pair.load_kg[1]} kg: load the two slopes in step and finish the lighter one early, so the roof is never loaded on one side`,
        );
      }
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

  const waste = system.waste_pct;
  const tilesOrder = orderQuantity(tiles, waste.tiles);
  const stock = planStockLengths(tally, system.batten.stock_length_mm);
  const battenLengths = orderQuantity(stock.lengths, waste.battens);
  const perRollM2 = ((system.underlay.roll_width_mm - system.underlay.head_lap_mm) * system.underlay.roll_length_mm) / 1e6;
  const underlayNet = slope > 0 ? Math.ceil(slope / perRollM2 - 1e-9) : 0;
  const underlayRolls = orderQuantity(underlayNet, waste.underlay);
  const ridgeOrder = orderQuantity(ridgeTiles, waste.ridge_hip);
  const hipOrder = orderQuantity(hipTiles, waste.ridge_hip);

  const delivery = planDelivery(
    {
      tilesOrdered: tilesOrder,
      faces,
      firstOff: [
        { item: 'underlay_rolls', quantity: underlayRolls, unit_kg: system.underlay.roll_kg },
        { item: 'battens', quantity: battenLengths, unit_kg: (system.batten.kg_per_m * system.batten.stock_length_mm) / 1000 },
        { item: 'batten_nails', quantity: battenNailCount, unit_kg: system.fixing.batten_nail_g / 1000 },
        { item: 'tile_nails', quantity: tileNailCount, unit_kg: system.fixing.tile_nail_g / 1000 },
        { item: 'clips', quantity: clipCount, unit_kg: system.fixing.clip_g / 1000 },
      ],
      lastOff: [
        { item: 'ridge_tiles', quantity: ridgeOrder, unit_kg: system.ridge.weight_kg },
        { item: 'hip_tiles', quantity: hipOrder, unit_kg: system.hip.weight_kg },
      ],
    },
    system,
    MAX_DELIVERY_PALLETS,
  );
  for (const issue of delivery.issues) warnings.push({ code: issue.code, building: null, face: null, message: issue.message });

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
export function faceDetail(face: Face, system: RoofSystem): FaceDetail {
  const problems = checkFacesAgainstSystem([face], system);
  if (problems.length > 0) throw new ScheduleRejectedError(problems);
  const result = estimate([face], system).faces[0];
  const setOut = setOutCourses(face.rafter_mm, face.pitch_deg, system) as CourseSetOut;
  const plan = planFaceBattens(face, insets(face), setOut, system, null, 1, true);
  const rows = plan.rows ?? [];
  const indices = loadingRowIndices(setOut.courses, system.roof_loading.every_nth_batten);
  const positions = indices.map((r) => {
    const row = rows.find((b) => b.y_mm === rowHeight(setOut, r));
    return row ? row.supports : 0;
  });
  const placed = planFaceLoading(result.tiles, positions, system.roof_loading.stack_size);
  return {
    face: result,
    battens: rows,
    loading: indices.map((r, i) => ({ batten: r + 1, positions: positions[i], stacks: placed.stacks_by_row[i] })),
  };
}

export type RunOutcome =
  | { ok: true; result: EngineResult }
  | { ok: false; errors: InputProblem[] };

function withParseWarnings(result: EngineResult, parseWarnings: readonly ScheduleWarning[]): EngineResult {
  if (parseWarnings.length === 0) return result;
  return { ...result, warnings: [...parseWarnings, ...result.warnings] };
}

/**
 * The whole pipeline from CSV text: read the roof system (partial → full, errors naming the field),
 * read and check the schedule (errors naming row and column, every problem at once), estimate. A
 * rejected input gives errors and no result.
 */
export function runEstimateFromCsv(csvText: string, systemInput?: RoofSystemInput | unknown): RunOutcome {
  const sys = parseRoofSystem(systemInput ?? {});
  const parsed = parseScheduleCsv(csvText, sys.ok ? sys.system : undefined);
  const errors: InputProblem[] = [];
  if (!sys.ok) errors.push(...sys.errors);
  if (!parsed.ok) errors.push(...parsed.errors);
  if (errors.length > 0 || !sys.ok || !parsed.ok) return { ok: false, errors };
  return { ok: true, result: withParseWarnings(estimate(parsed.faces, sys.system), parsed.warnings) };
}

/**
 * The whole pipeline from a JSON schedule (an array of rows as scheduleRowSchema describes). Errors
 * give the entry number (from 1) as row, and the column.
 */
export function runEstimate(rows: unknown, systemInput?: RoofSystemInput | unknown): RunOutcome {
  const sys = parseRoofSystem(systemInput ?? {});
  const errors: InputProblem[] = [];
  if (!sys.ok) errors.push(...sys.errors);
  const parsed = scheduleSchema.safeParse(rows);
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
  if (errors.length > 0 || !sys.ok || !parsed.success) return { ok: false, errors };
  return { ok: true, result: estimate(parsed.data, sys.system) };
}

/** One line per problem, as the CLI and logs print it: `row 3, column eaves_mm: must be …`. */
export function formatProblem(p: InputProblem): string {
  const where: string[] = [];
  if (p.row !== undefined) where.push(`row ${p.row}`);
  if (p.column !== undefined) where.push(`column ${p.column}`);
  if (p.field !== undefined) where.push(`system field ${p.field}`);
  return where.length > 0 ? `${where.join(', ')}: ${p.message}` : p.message;
}
