import { z } from 'zod';
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
  faces: z
    .array(z.unknown())
    .min(1, { error: 'the schedule has no faces' })
    .max(MAX_SCHEDULE_FACES, { error: `at most ${MAX_SCHEDULE_FACES} faces` }),
  openings: z
    .array(z.unknown())
    .max(MAX_SCHEDULE_OPENINGS, { error: `at most ${MAX_SCHEDULE_OPENINGS} openings` })
    .optional(),
});

export const storedFaceSchema = z.object({
  id: z.number().int(),
  /** Order in the schedule, from 1. */
  position: z.number().int(),
  building: z.string(),
  face: z.string(),
  quantity: z.number().int().min(1).max(SCHEDULE_LIMITS.maxQuantity),
  pitch_deg: z.number(),
  rafter_mm: z.number(),
  run_mm: z.number(),
  eaves_mm: z.number(),
  top_mm: z.number(),
  left: z.enum(EDGE_KINDS),
  right: z.enum(EDGE_KINDS),
  top: z.enum(TOP_KINDS),
  /** The ridge line the top edge meets; null when not named. */
  ridge: z.string().nullable(),
  /** True for a face saved before top_mm was required beside a hip or valley: its top was taken as the eaves. */
  top_assumed: z.boolean(),
});
export type StoredFace = z.infer<typeof storedFaceSchema>;

export const storedOpeningSchema = z.object({
  id: z.number().int(),
  position: z.number().int(),
  building: z.string(),
  face: z.string(),
  kind: z.enum(OPENING_KINDS),
  width_mm: z.number(),
  height_mm: z.number(),
  quantity: z.number().int(),
});
export type StoredOpening = z.infer<typeof storedOpeningSchema>;

export const scheduleVersionSchema = z.object({
  id: z.number().int(),
  project_id: z.number().int(),
  version: z.number().int(),
  source: z.enum(SCHEDULE_SOURCES),
  filename: z.string().nullable(),
  face_count: z.number().int(),
  created_at: z.string(),
  created_by: z.object({ id: z.number().int(), name: z.string() }).nullable(),
});
export type ScheduleVersion = z.infer<typeof scheduleVersionSchema>;

export const scheduleWarningSchema = z.object({ code: z.string(), message: z.string() });

/** Reading a site's schedule: `optional=1` answers null (200) for a site without one, instead of 404. */
export const currentScheduleQuerySchema = z.object({
  optional: z
    .enum(['0', '1'])
    .optional()
    .transform((v) => v === '1'),
});

export const scheduleResponseSchema = scheduleVersionSchema.extend({
  faces: z.array(storedFaceSchema),
  openings: z.array(storedOpeningSchema),
  warnings: z.array(scheduleWarningSchema),
});
export type ScheduleResponse = z.infer<typeof scheduleResponseSchema>;

export const scheduleHistorySchema = z.object({ schedules: z.array(scheduleVersionSchema) });

export const scheduleVersionParamsSchema = z.object({
  id: z.coerce.number().int().positive(),
  version: z.coerce.number().int().positive(),
});

/** One rejected cell: spreadsheet row (header = 1; entry number from 1 for JSON) and column. */
export const scheduleProblemSchema = z.object({
  row: z.number().int().optional(),
  column: z.string().optional(),
  path: z.string().optional(),
  message: z.string(),
});
export type ScheduleProblem = z.infer<typeof scheduleProblemSchema>;
