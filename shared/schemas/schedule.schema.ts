import './zod-messages';
import * as z from 'zod/mini';

/**
 * The roof schedule: one row per roof face. Lengths in millimetres, pitch in degrees.
 * The CSV importer, the API and the client form all check a row with the same rules and words,
 * so the checks that need more than one field live here as plain functions the CSV reader calls too.
 */

export const EDGE_KINDS = ['verge', 'hip', 'valley', 'abutment'] as const;
export const TOP_KINDS = ['ridge', 'mono_ridge', 'abutment'] as const;
export type EdgeKind = (typeof EDGE_KINDS)[number];
export type TopKind = (typeof TOP_KINDS)[number];

/** Column names of the schedule, in the order the example file uses. */
export const SCHEDULE_COLUMNS = ['building', 'face', 'quantity', 'pitch_deg', 'rafter_mm', 'run_mm', 'eaves_mm', 'top_mm', 'left', 'right', 'top', 'ridge'] as const;
export type ScheduleColumn = (typeof SCHEDULE_COLUMNS)[number];

export const SCHEDULE_LIMITS = {
  /** Identical faces on one row; beyond this a job should be split (keeps the delivery plan bounded). */
  maxQuantity: 10_000,
  /** A millimetre value below this is almost certainly metres typed into a millimetre column. */
  metresBelowMm: 100,
  /** No single roof face is longer or wider than 100 m; a bigger figure is a unit slip. */
  maxLengthMm: 100_000,
  /** rafter_mm and run_mm given together must agree with the pitch within this fraction. */
  rafterRunTolerance: 0.01,
  /** Two verges make a rectangle: top_mm may differ from eaves_mm by this fraction at most. */
  rectangleTolerance: 0.01,
  maxTextLength: 100,
} as const;

export const SCHEDULE_MESSAGES = {
  required: 'is required',
  notNumber: 'must be a number',
  positiveMm: 'must be a positive number of millimetres',
  nonNegativeMm: 'must be zero or a positive number of millimetres',
  pitchRange: 'must be a pitch in degrees above 0 and below 90',
  quantity: `must be a whole number from 1 to ${SCHEDULE_LIMITS.maxQuantity}`,
  textTooLong: `must be at most ${SCHEDULE_LIMITS.maxTextLength} characters`,
  rafterOrRun: 'give rafter_mm or run_mm (or both)',
  steepRun: 'give rafter_mm for faces of 80° and steeper',
  topRequired: 'required on a face with a hip or valley edge',
  ridgeOnAbutment: 'a face whose top is an abutment meets no ridge: leave ridge blank',
} as const;

/**
 * From this pitch a rafter worked out from its run (run ÷ cos pitch) is too sensitive to the pitch to
 * trust: at 80° a 1° slip moves it by about 10 %, so the rafter must be measured.
 */
export const STEEP_RUN_PITCH_DEG = 80;

function formatNumber(v: number): string {
  return Number.isInteger(v) ? String(v) : String(Math.round(v * 1000) / 1000);
}

/** Why a millimetre value cannot be used, or null. Zero is allowed only where it means something (top_mm). */
export function millimetreProblem(v: number, allowZero = false): string | null {
  if (!Number.isFinite(v)) return SCHEDULE_MESSAGES.notNumber;
  if (v < 0 || (v === 0 && !allowZero)) return allowZero ? SCHEDULE_MESSAGES.nonNegativeMm : SCHEDULE_MESSAGES.positiveMm;
  if (v > 0 && v < SCHEDULE_LIMITS.metresBelowMm) {
    return `looks like metres (${formatNumber(v)}); give millimetres, e.g. ${formatNumber(v * 1000)}`;
  }
  if (v > SCHEDULE_LIMITS.maxLengthMm) {
    return `is more than 100 m (${formatNumber(v)} mm); check the units`;
  }
  return null;
}

export function pitchProblem(v: number): string | null {
  if (!Number.isFinite(v) || v <= 0 || v >= 90) return SCHEDULE_MESSAGES.pitchRange;
  return null;
}

export function quantityProblem(v: number): string | null {
  if (!Number.isInteger(v) || v < 1 || v > SCHEDULE_LIMITS.maxQuantity) return SCHEDULE_MESSAGES.quantity;
  return null;
}

export function edgeProblem(word: string): string | null {
  return (EDGE_KINDS as readonly string[]).includes(word) ? null : `unknown edge '${word}': use verge, hip, valley or abutment`;
}

export function topProblem(word: string): string | null {
  return (TOP_KINDS as readonly string[]).includes(word) ? null : `unknown top edge '${word}': use ridge, mono_ridge or abutment`;
}

/** Spreadsheets write "Mono-Ridge" or "mono ridge"; the schedule means the same word. */
export function normaliseEdgeWord(raw: string): string {
  return raw
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, '_');
}

/** The fields of one row once each cell has been read on its own. */
export interface FaceCandidate {
  building: string;
  face: string;
  quantity: number;
  pitch_deg: number;
  rafter_mm?: number;
  run_mm?: number;
  eaves_mm: number;
  top_mm?: number;
  left: EdgeKind;
  right: EdgeKind;
  top: TopKind;
  /** Name of the ridge line the face's top edge meets, unique within its building. */
  ridge?: string;
}

export interface FieldProblem {
  column: ScheduleColumn;
  message: string;
}

const NO_PROBLEMS: FieldProblem[] = Object.freeze([]) as unknown as FieldProblem[];

/** True when either side of the face is a hip or a valley: its top length is then not the eaves length. */
export function hasDiagonalEdge(c: Pick<FaceCandidate, 'left' | 'right'>): boolean {
  return c.left === 'hip' || c.left === 'valley' || c.right === 'hip' || c.right === 'valley';
}

/**
 * Checks that need several fields of one row: rafter or run present (rafter measured at 80° and
 * steeper), rafter and run agreeing with the pitch within 1 %, a face between two verges being a
 * rectangle, top_mm given beside a hip or valley, and a ridge named only under a ridge.
 */
export function crossCheckFace(c: FaceCandidate): FieldProblem[] {
  let problems: FieldProblem[] = NO_PROBLEMS;
  if (c.rafter_mm === undefined && c.run_mm === undefined) {
    problems = [{ column: 'rafter_mm', message: SCHEDULE_MESSAGES.rafterOrRun }];
  } else if (c.rafter_mm === undefined && c.pitch_deg >= STEEP_RUN_PITCH_DEG) {
    problems = [{ column: 'run_mm', message: SCHEDULE_MESSAGES.steepRun }];
  } else if (c.rafter_mm !== undefined && c.run_mm !== undefined) {
    const fromRun = c.run_mm / Math.cos((c.pitch_deg * Math.PI) / 180);
    if (Math.abs(fromRun - c.rafter_mm) > SCHEDULE_LIMITS.rafterRunTolerance * c.rafter_mm) {
      problems = [];
      problems.push({
        column: 'run_mm',
        message: `does not agree with rafter_mm at ${formatNumber(c.pitch_deg)}°: a run of ${formatNumber(c.run_mm)} mm gives a rafter of ${Math.round(fromRun)} mm, not ${formatNumber(c.rafter_mm)} (more than 1 % apart)`,
      });
    }
  }
  if (c.left === 'verge' && c.right === 'verge' && c.top_mm !== undefined) {
    if (Math.abs(c.top_mm - c.eaves_mm) > SCHEDULE_LIMITS.rectangleTolerance * c.eaves_mm) {
      if (problems === NO_PROBLEMS) problems = [];
      problems.push({
        column: 'top_mm',
        message: `a face with verges on both sides is a rectangle: top_mm must equal eaves_mm (${formatNumber(c.eaves_mm)}) or be left blank`,
      });
    }
  }
  if (c.top_mm === undefined && hasDiagonalEdge(c)) {
    if (problems === NO_PROBLEMS) problems = [];
    problems.push({ column: 'top_mm', message: SCHEDULE_MESSAGES.topRequired });
  }
  if (c.ridge !== undefined && c.top === 'abutment') {
    if (problems === NO_PROBLEMS) problems = [];
    problems.push({ column: 'ridge', message: SCHEDULE_MESSAGES.ridgeOnAbutment });
  }
  return problems;
}

/** Fills the derived fields of a checked row: rafter from run, top from eaves. */
export function resolveFace(c: FaceCandidate): Face {
  return new ResolvedFace(c);
}

/** The pitch of the last face resolved and its cosine (in a typed array: no number boxed per pitch). */
const lastPitchCos = new Float64Array([NaN, NaN]);

/**
 * A checked face. Built by a constructor, not an object literal: V8 moves objects from a literal whose
 * copies all outlive a young-generation collection straight into the old generation from then on, and
 * a big schedule's faces would then stay in memory until the next full collection (see DEVELOPERS.md,
 * decision 31). Its fields, their order and its JSON are those of the literal it replaces.
 */
class ResolvedFace {
  declare building: string;
  declare face: string;
  declare quantity: number;
  declare pitch_deg: number;
  declare rafter_mm: number;
  declare run_mm: number;
  declare eaves_mm: number;
  declare top_mm: number;
  declare left: EdgeKind;
  declare right: EdgeKind;
  declare top: TopKind;
  declare ridge?: string;
  declare top_assumed?: boolean;

  constructor(c: FaceCandidate) {
    // Faces of one roof mostly share a pitch: its cosine is worked out once for them.
    if (c.pitch_deg !== lastPitchCos[0]) {
      lastPitchCos[0] = c.pitch_deg;
      lastPitchCos[1] = Math.cos((c.pitch_deg * Math.PI) / 180);
    }
    const cos = lastPitchCos[1];
    const rafter = c.rafter_mm ?? (c.run_mm as number) / cos;
    const bothVerges = c.left === 'verge' && c.right === 'verge';
    this.building = c.building;
    this.face = c.face;
    this.quantity = c.quantity;
    this.pitch_deg = c.pitch_deg;
    this.rafter_mm = rafter;
    this.run_mm = c.run_mm ?? rafter * cos;
    this.eaves_mm = c.eaves_mm;
    // Between two verges the face is a rectangle; a top within 1 % of the eaves is read as the same length.
    this.top_mm = bothVerges ? c.eaves_mm : (c.top_mm ?? c.eaves_mm);
    this.left = c.left;
    this.right = c.right;
    this.top = c.top;
    if (c.ridge !== undefined) this.ridge = c.ridge;
    // Only a stored schedule from before top_mm was required beside hips and valleys gets here without one.
    if (c.top_mm === undefined && !bothVerges && hasDiagonalEdge(c)) this.top_assumed = true;
  }
}

/** Key that makes a face unique within its building (names compared without case or outer spaces). */
export function faceKey(building: string, face: string): string {
  return `${building.trim().toLowerCase()}\u0000${face.trim().toLowerCase()}`;
}

/**
 * Values filed by face, building and face name compared as faceKey compares them (without case or
 * outer spaces), without building a joined key per face: a big job looks up every face, and faces of
 * one building usually follow each other.
 */
export class FaceLookup<T> {
  private readonly byBuilding = new Map<string, Map<string, T>>();
  private lastBuilding: string | null = null;
  private lastFaces: Map<string, T> | undefined;

  private faces(building: string, create: boolean): Map<string, T> | undefined {
    if (building === this.lastBuilding && (this.lastFaces || !create)) return this.lastFaces;
    const key = building.trim().toLowerCase();
    let faces = this.byBuilding.get(key);
    if (!faces && create) {
      faces = new Map();
      this.byBuilding.set(key, faces);
    }
    this.lastBuilding = building;
    this.lastFaces = faces;
    return faces;
  }

  get(building: string, face: string): T | undefined {
    return this.faces(building, false)?.get(face.trim().toLowerCase());
  }

  set(building: string, face: string, value: T) {
    (this.faces(building, true) as Map<string, T>).set(face.trim().toLowerCase(), value);
  }
}

function mmField(allowZero: boolean) {
  return z.number({ error: SCHEDULE_MESSAGES.notNumber }).check(
    z.superRefine((v, ctx) => {
      const problem = millimetreProblem(v, allowZero);
      if (problem) ctx.addIssue({ code: 'custom', message: problem });
    }),
  );
}

const textField = z
  .string({ error: SCHEDULE_MESSAGES.required })
  .check(z.trim(), z.minLength(1, { error: SCHEDULE_MESSAGES.required }), z.maxLength(SCHEDULE_LIMITS.maxTextLength, { error: SCHEDULE_MESSAGES.textTooLong }));

const edgeField = z.pipe(z.pipe(z.string(), z.transform(normaliseEdgeWord)), z.enum(EDGE_KINDS, { error: (iss) => edgeProblem(String(iss.input)) ?? 'unknown edge' }));

const topField = z.pipe(z.pipe(z.string(), z.transform(normaliseEdgeWord)), z.enum(TOP_KINDS, { error: (iss) => topProblem(String(iss.input)) ?? 'unknown top edge' }));

/** One schedule row as a person or a client sends it (JSON): optional fields may be left out. */
export const scheduleRowSchema = z
  .object({
    building: z._default(z.optional(textField), '1'),
    face: textField,
    quantity: z._default(
      z.optional(
        z
          .number({ error: SCHEDULE_MESSAGES.quantity })
          .check(z.int({ error: SCHEDULE_MESSAGES.quantity }), z.gte(1, { error: SCHEDULE_MESSAGES.quantity }), z.lte(SCHEDULE_LIMITS.maxQuantity, { error: SCHEDULE_MESSAGES.quantity })),
      ),
      1,
    ),
    pitch_deg: z.number({ error: SCHEDULE_MESSAGES.pitchRange }).check(
      z.gt(0, { error: SCHEDULE_MESSAGES.pitchRange }),
      z.lt(90, {
        error: SCHEDULE_MESSAGES.pitchRange,
      }),
    ),
    rafter_mm: z.optional(mmField(false)),
    run_mm: z.optional(mmField(false)),
    eaves_mm: mmField(false),
    top_mm: z.optional(mmField(true)),
    left: z._default(z.optional(edgeField), 'verge'),
    right: z._default(z.optional(edgeField), 'verge'),
    top: z._default(z.optional(topField), 'ridge'),
    ridge: z.optional(textField),
  })
  .check(
    z.superRefine((row, ctx) => {
      for (const p of crossCheckFace(row as FaceCandidate)) {
        ctx.addIssue({ code: 'custom', path: [p.column], message: p.message });
      }
    }),
  );

export type ScheduleRowInput = z.input<typeof scheduleRowSchema>;

/** A checked face with every field resolved: what the engine works from. */
export const faceSchema = z.object({
  building: z.string().check(z.minLength(1)),
  face: z.string().check(z.minLength(1)),
  quantity: z.number().check(z.int(), z.gte(1), z.lte(SCHEDULE_LIMITS.maxQuantity)),
  pitch_deg: z.number().check(z.gt(0), z.lt(90)),
  rafter_mm: z.number().check(z.positive()),
  run_mm: z.number().check(z.positive()),
  eaves_mm: z.number().check(z.positive()),
  top_mm: z.number().check(z.gte(0)),
  left: z.enum(EDGE_KINDS),
  right: z.enum(EDGE_KINDS),
  top: z.enum(TOP_KINDS),
  /** The ridge line the top edge meets; faces of a building with the same name are one ridge. */
  ridge: z.optional(z.string().check(z.minLength(1))),
  /** Set on a stored face that has a hip or valley edge and no top_mm: top was taken as the eaves. */
  top_assumed: z.optional(z.boolean()),
});
export type Face = z.infer<typeof faceSchema>;

/**
 * A whole schedule sent as JSON: at least one face, no face twice in a building; the result is the
 * resolved faces. Issue paths are [index, column].
 */
export const scheduleSchema = z.pipe(
  z.array(scheduleRowSchema).check(
    z.minLength(1, { error: 'the schedule has no faces' }),
    z.superRefine((rows, ctx) => {
      const seen = new Map<string, number>();
      rows.forEach((row, i) => {
        const key = faceKey(row.building, row.face);
        const first = seen.get(key);
        if (first === undefined) seen.set(key, i);
        else {
          ctx.addIssue({
            code: 'custom',
            path: [i, 'face'],
            message: `duplicate face '${row.face}' in building '${row.building}' (first given at entry ${first + 1})`,
          });
        }
      });
    }),
  ),
  z.transform((rows) => rows.map((row) => resolveFace(row as FaceCandidate))),
);

export type ScheduleInput = z.input<typeof scheduleSchema>;
export type Schedule = Face[];
