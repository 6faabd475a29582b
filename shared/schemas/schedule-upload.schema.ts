import './zod-messages';
import * as z from 'zod/mini';
import { OPENING_KINDS } from './openings.schema';
import { EDGE_KINDS, SCHEDULE_LIMITS, TOP_KINDS } from './schedule.schema';

/**
 * Sending a roof schedule to a site: a CSV file (as the request body with Content-Type text/csv, or
 * as the multipart field `file`) or the face list as JSON. A rejected schedule stores nothing and
 * answers 422 {error:{code:"invalid_schedule", details:[{row, column, message}]}}.
 */

/** The largest schedule file accepted: 5 MiB. */
export const MAX_SCHEDULE_BYTES = 5 * 1024 * 1024;
/** Rows are face types with a quantity, so even a large development fits well within this. */
export const MAX_SCHEDULE_FACES = 2000;
export const SCHEDULE_FILE_FIELD = 'file';
export const SCHEDULE_CONTENT_TYPES = ['text/csv', 'application/csv', 'text/plain'] as const;

export const SCHEDULE_SOURCES = ['csv', 'form'] as const;

/** Openings in one schedule version: far more than any real development needs. */
export const MAX_SCHEDULE_OPENINGS = 5000;

/**
 * Faces typed or edited by hand: the whole list, each row as scheduleRowSchema reads it, and the
 * openings in them, each as openingRowSchema reads it (left out: none).
 */
export const putFacesBodySchema = z.object({
  faces: z.array(z.unknown()).check(z.minLength(1, { error: 'the schedule has no faces' }), z.maxLength(MAX_SCHEDULE_FACES, { error: `at most ${MAX_SCHEDULE_FACES} faces` })),
  openings: z.optional(z.array(z.unknown()).check(z.maxLength(MAX_SCHEDULE_OPENINGS, { error: `at most ${MAX_SCHEDULE_OPENINGS} openings` }))),
});

export const storedFaceSchema = z.object({
  id: z.number().check(z.int()),
  /** Order in the schedule, from 1. */
  position: z.number().check(z.int()),
  building: z.string(),
  face: z.string(),
  quantity: z.number().check(z.int(), z.gte(1), z.lte(SCHEDULE_LIMITS.maxQuantity)),
  pitch_deg: z.number(),
  rafter_mm: z.number(),
  run_mm: z.number(),
  eaves_mm: z.number(),
  top_mm: z.number(),
  left: z.enum(EDGE_KINDS),
  right: z.enum(EDGE_KINDS),
  top: z.enum(TOP_KINDS),
  /** The ridge line the top edge meets; null when not named. */
  ridge: z.nullable(z.string()),
  /** True for a face saved before top_mm was required beside a hip or valley: its top was taken as the eaves. */
  top_assumed: z.boolean(),
});
export type StoredFace = z.infer<typeof storedFaceSchema>;

export const storedOpeningSchema = z.object({
  id: z.number().check(z.int()),
  position: z.number().check(z.int()),
  building: z.string(),
  face: z.string(),
  kind: z.enum(OPENING_KINDS),
  width_mm: z.number(),
  height_mm: z.number(),
  quantity: z.number().check(z.int()),
});
export type StoredOpening = z.infer<typeof storedOpeningSchema>;

export const scheduleVersionSchema = z.object({
  id: z.number().check(z.int()),
  project_id: z.number().check(z.int()),
  version: z.number().check(z.int()),
  source: z.enum(SCHEDULE_SOURCES),
  filename: z.nullable(z.string()),
  face_count: z.number().check(z.int()),
  created_at: z.string(),
  created_by: z.nullable(z.object({ id: z.number().check(z.int()), name: z.string() })),
});
export type ScheduleVersion = z.infer<typeof scheduleVersionSchema>;

export const scheduleWarningSchema = z.object({ code: z.string(), message: z.string() });

/** Reading a site's schedule: `optional=1` answers null (200) for a site without one, instead of 404. */
export const currentScheduleQuerySchema = z.object({
  optional: z.pipe(
    z.optional(z.enum(['0', '1'])),
    z.transform((v) => v === '1'),
  ),
});

export const scheduleResponseSchema = z.extend(scheduleVersionSchema, {
  faces: z.array(storedFaceSchema),
  openings: z.array(storedOpeningSchema),
  warnings: z.array(scheduleWarningSchema),
});
export type ScheduleResponse = z.infer<typeof scheduleResponseSchema>;

export const scheduleHistorySchema = z.object({ schedules: z.array(scheduleVersionSchema) });

export const scheduleVersionParamsSchema = z.object({
  id: z.coerce.number().check(z.int(), z.positive()),
  version: z.coerce.number().check(z.int(), z.positive()),
});

/** One rejected cell: spreadsheet row (header = 1; entry number from 1 for JSON) and column. */
export const scheduleProblemSchema = z.object({
  row: z.optional(z.number().check(z.int())),
  column: z.optional(z.string()),
  path: z.optional(z.string()),
  message: z.string(),
});
export type ScheduleProblem = z.infer<typeof scheduleProblemSchema>;
