import './zod-messages';
import * as z from 'zod/mini';
import { FaceLookup, SCHEDULE_LIMITS, SCHEDULE_MESSAGES, millimetreProblem, quantityProblem, type Face } from './schedule.schema';

/**
 * Openings in roof faces: roof windows, chimneys, dormers and hatches. One row per kind and size of
 * opening on a face; width across the slope and height up the slope in millimetres. Where on the face
 * an opening sits is not given, so the engine counts what it takes out and what it adds in the same
 * way wherever it is.
 */

export const OPENING_KINDS = ['roof_window', 'chimney', 'dormer', 'hatch'] as const;
export type OpeningKind = (typeof OPENING_KINDS)[number];

export const OPENING_COLUMNS = ['building', 'face', 'kind', 'width_mm', 'height_mm', 'quantity'] as const;
export type OpeningColumn = (typeof OPENING_COLUMNS)[number];

export function openingKindProblem(word: string): string | null {
  return (OPENING_KINDS as readonly string[]).includes(word) ? null : `unknown kind '${word}': use roof_window, chimney, dormer or hatch`;
}

/** Spreadsheets write "Roof window" or "roof-window"; the file means the same word. */
export function normaliseOpeningKind(raw: string): string {
  return raw
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, '_');
}

const textField = z
  .string({ error: SCHEDULE_MESSAGES.required })
  .check(z.trim(), z.minLength(1, { error: SCHEDULE_MESSAGES.required }), z.maxLength(SCHEDULE_LIMITS.maxTextLength, { error: SCHEDULE_MESSAGES.textTooLong }));

const mmField = z.number({ error: SCHEDULE_MESSAGES.notNumber }).check(
  z.superRefine((v, ctx) => {
    const problem = millimetreProblem(v, false);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  }),
);

/** One opening row as a person or a client sends it (JSON). */
export const openingRowSchema = z.object({
  building: z._default(z.optional(textField), '1'),
  face: textField,
  kind: z.pipe(z.pipe(z.string({ error: SCHEDULE_MESSAGES.required }), z.transform(normaliseOpeningKind)), z.enum(OPENING_KINDS, { error: (iss) => openingKindProblem(String(iss.input)) ?? 'unknown kind' })),
  width_mm: mmField,
  height_mm: mmField,
  quantity: z._default(
    z.optional(
      z.number({ error: SCHEDULE_MESSAGES.quantity }).check(
        z.superRefine((v, ctx) => {
          const problem = quantityProblem(v);
          if (problem) ctx.addIssue({ code: 'custom', message: problem });
        }),
      ),
    ),
    1,
  ),
});
export type OpeningRowInput = z.input<typeof openingRowSchema>;

/** A checked opening: what the engine works from. */
export const openingSchema = z.object({
  building: z.string().check(z.minLength(1)),
  face: z.string().check(z.minLength(1)),
  kind: z.enum(OPENING_KINDS),
  width_mm: z.number().check(z.positive()),
  height_mm: z.number().check(z.positive()),
  quantity: z.number().check(z.int(), z.gte(1)),
});
export type Opening = z.infer<typeof openingSchema>;

export const openingsSchema = z.array(openingRowSchema);
export type OpeningsInput = z.input<typeof openingsSchema>;

export interface OpeningProblem {
  /** Index of the opening in its list (0-based). */
  index: number;
  column: OpeningColumn;
  message: string;
}

/**
 * Checks openings against the faces they sit in: the face must be in the schedule, the opening no
 * wider than the face's widest edge and no taller than its rafter.
 */
export function checkOpeningsAgainstFaces(openings: readonly Opening[], faces: readonly Face[]): OpeningProblem[] {
  const byKey = new FaceLookup<Face>();
  for (const f of faces) byKey.set(f.building, f.face, f);
  const problems: OpeningProblem[] = [];
  openings.forEach((o, index) => checkOpeningInFace(o, index, byKey.get(o.building, o.face), problems));
  return problems;
}

/** The problems of one opening (at `index` in its list) in the face it names (undefined when the schedule has none), into `problems`. */
export function checkOpeningInFace(o: Opening, index: number, face: Face | undefined, problems: OpeningProblem[]) {
  if (!face) {
    problems.push({ index, column: 'face', message: `no face '${o.face}' in building '${o.building}' in the schedule` });
    return;
  }
  const widest = Math.max(face.eaves_mm, face.top_mm);
  if (o.width_mm > widest) {
    problems.push({ index, column: 'width_mm', message: `${o.width_mm} mm is wider than face '${face.face}' (${Math.round(widest)} mm at its widest)` });
  }
  if (o.height_mm > face.rafter_mm) {
    problems.push({ index, column: 'height_mm', message: `${o.height_mm} mm is taller than face '${face.face}' (rafter ${Math.round(face.rafter_mm)} mm)` });
  }
}
