import { checkOpeningsAgainstFaces, openingsSchema, type Opening } from '../schemas/openings.schema';
import type { RoofSystem, RoofSystemInput } from '../schemas/roof-system.schema';
import { FaceLookup, faceKey, scheduleSchema, type Face, type Schedule } from '../schemas/schedule.schema';
import { PieceTally, planFaceBattens, type BattenRow } from './battens';
import { lowestPitch, rowHeight, setOutCourses, type CourseSetOut } from './courses';
import { newScratch } from './face-courses';
import { computeFace } from './face-figures';
import { insets } from './geometry';
import { JobTally, finishJob } from './job-tally';
import { loadingRowIndices, planFaceLoading, type RidgeBalance } from './loading';
import { ScheduleRejectedError, belowPitchMessage } from './notices';
import { readOpeningsCsv } from './openings-parse';
import type { EngineResult, EngineWarning, FaceResult, InputProblem } from './result';
import { finishBuilding, newRidgeGroups } from './ridge-groups';
import { parseRoofSystem } from './roof-system';
import { readScheduleCsv, type ScheduleWarning } from './schedule-parse';

// The engine's public face: the rest of the code base and the tests take these from here.
export { orderQuantity } from './job-tally';
export { ScheduleRejectedError, belowPitchMessage } from './notices';

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

/**
 * estimate() for a schedule and openings already checked (the CSV pipeline checks them as it reads
 * them, and gives the index of each opening's face in `faceOf`).
 */
function estimateChecked(schedule: Schedule, system: RoofSystem, openings: readonly Opening[], faceOf: readonly number[] | null = null): EngineResult {
  const openingsOf = openings.length > 0 ? openingsByFace(openings, schedule, faceOf) : null;

  const warnings: EngineWarning[] = [];
  const tally = new PieceTally(system.batten.stock_length_mm);
  const scratch = newScratch(system);
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
  for (const b of job.buildings) finishBuilding(b, schedule, system, job, ridges, warnings, groups);
  return finishJob(faces, system, tally, job, ridges, warnings);
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
    const readOpenings = readOpeningsCsv(openingsCsv, parsed.ok ? parsed.faces : undefined, read.index);
    const o = readOpenings.parsed;
    if (!o.ok) errors.push(...o.errors.map((p) => ({ ...p, file: 'openings' as const })));
    else {
      openings = o.openings;
      faceOf = readOpenings.faceOf;
      openingWarnings.push(...o.warnings);
    }
  }
  // The faces' names the reader filed serve the openings only: let go of them, so they die young.
  read.index = null;
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
