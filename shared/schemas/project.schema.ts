import { z } from 'zod';

/** A contractor's site: where the roofs are, who to ring, and what a lorry finds when it arrives. */

/** The biggest vehicle that can reach the set-down place. */
export const VEHICLE_ACCESS = ['any', 'rigid_only', 'small_only'] as const;
export const VEHICLE_ACCESS_LABELS: Record<(typeof VEHICLE_ACCESS)[number], string> = {
  any: 'Any lorry, articulated included',
  rigid_only: 'Rigid lorries only',
  small_only: 'Small lorries only (7.5 t)',
};
/** Whether the lorry's crane may lift on this site. */
export const CRANE_LIFT = ['allowed', 'not_allowed', 'unknown'] as const;
export const CRANE_LIFT_LABELS: Record<(typeof CRANE_LIFT)[number], string> = {
  allowed: 'Crane lift possible',
  not_allowed: 'No crane lift',
  unknown: 'Crane lift not yet checked',
};
export const OVERHEAD_LINES = ['none', 'present', 'unknown'] as const;
export const OVERHEAD_LINES_LABELS: Record<(typeof OVERHEAD_LINES)[number], string> = {
  none: 'No overhead lines',
  present: 'Overhead lines near the set-down place',
  unknown: 'Overhead lines not yet checked',
};
export const BUILDING_KINDS = ['building', 'plot'] as const;

const text = (max: number) =>
  z
    .string()
    .trim()
    .max(max, { error: `must be at most ${max} characters` });
const required = (max: number) => text(max).min(1, { error: 'is required' });

export const buildingInputSchema = z.object({
  name: required(100),
  kind: z.enum(BUILDING_KINDS, { error: 'must be building or plot' }).default('building'),
  notes: text(500).default(''),
});

const phone = text(40).refine((v) => v === '' || /^[0-9+()\s-]{6,40}$/.test(v), {
  error: 'must be a phone number (digits, spaces, + ( ) -)',
});

const buildingsSchema = z
  .array(buildingInputSchema)
  .max(500, { error: 'at most 500 buildings or plots' })
  .superRefine((list, ctx) => {
    const seen = new Set<string>();
    list.forEach((b, i) => {
      const key = b.name.toLowerCase();
      if (seen.has(key)) ctx.addIssue({ code: 'custom', path: [i, 'name'], message: `'${b.name}' is given twice` });
      seen.add(key);
    });
  });

const editableFields = {
  name: required(160),
  reference: text(60),
  site_address: required(400),
  site_postcode: text(20),
  contact_name: text(120),
  contact_phone: phone,
  vehicle_access: z.enum(VEHICLE_ACCESS, { error: 'must be any, rigid_only or small_only' }),
  crane_lift: z.enum(CRANE_LIFT, { error: 'must be allowed, not_allowed or unknown' }),
  overhead_lines: z.enum(OVERHEAD_LINES, { error: 'must be none, present or unknown' }),
  set_down_place: text(400),
  access_notes: text(2000),
  buildings: buildingsSchema,
};

export const createProjectBodySchema = z.object({
  ...editableFields,
  reference: editableFields.reference.default(''),
  site_postcode: editableFields.site_postcode.default(''),
  contact_name: editableFields.contact_name.default(''),
  contact_phone: editableFields.contact_phone.default(''),
  vehicle_access: editableFields.vehicle_access.default('any'),
  crane_lift: editableFields.crane_lift.default('unknown'),
  overhead_lines: editableFields.overhead_lines.default('unknown'),
  set_down_place: editableFields.set_down_place.default(''),
  access_notes: editableFields.access_notes.default(''),
  buildings: editableFields.buildings.default([]),
});
export type CreateProjectBody = z.input<typeof createProjectBodySchema>;

/**
 * An edit sends only what changes; buildings, when sent, replace the whole list. It names the revision
 * it was made on: someone else's save in between makes it stale (409).
 */
export const updateProjectBodySchema = z
  .object(editableFields)
  .partial()
  .extend({ revision: z.number({ error: 'is required: the revision of the site you edited' }).int().positive() })
  .refine((b) => Object.keys(b).some((k) => k !== 'revision'), { error: 'send at least one field to change' });
export type UpdateProjectBody = z.input<typeof updateProjectBodySchema>;

export const PROJECT_SORTS = ['name', 'created_at', 'updated_at', 'site_address'] as const;

export const projectListQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  sort: z.enum(PROJECT_SORTS).default('updated_at'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int().min(1).default(1),
  page_size: z.coerce.number().int().min(1).max(100).default(25),
  archived: z.enum(['false', 'true', 'all']).default('false'),
});
export type ProjectListQuery = z.input<typeof projectListQuerySchema>;

export const buildingSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  kind: z.enum(BUILDING_KINDS),
  notes: z.string(),
});

export const projectSummarySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  reference: z.string(),
  site_address: z.string(),
  site_postcode: z.string(),
  contact_name: z.string(),
  contact_phone: z.string(),
  building_count: z.number().int(),
  /** The schedule in use: the newest version, or null before the first import. */
  schedule: z.object({ id: z.number().int(), version: z.number().int(), face_count: z.number().int() }).nullable(),
  estimate_count: z.number().int(),
  archived_at: z.string().nullable(),
  created_at: z.string(),
  updated_at: z.string(),
});

export const projectSchema = projectSummarySchema.extend({
  /** Raised by every edit; an edit names the revision it was made on. */
  revision: z.number().int(),
  vehicle_access: z.enum(VEHICLE_ACCESS),
  crane_lift: z.enum(CRANE_LIFT),
  overhead_lines: z.enum(OVERHEAD_LINES),
  set_down_place: z.string(),
  access_notes: z.string(),
  buildings: z.array(buildingSchema),
});
export type Project = z.infer<typeof projectSchema>;
export type ProjectSummary = z.infer<typeof projectSummarySchema>;

export const projectListSchema = z.object({
  projects: z.array(projectSummarySchema),
  total: z.number().int(),
  page: z.number().int(),
  page_size: z.number().int(),
});
export type ProjectList = z.infer<typeof projectListSchema>;

export const projectParamsSchema = z.object({ id: z.coerce.number().int().positive() });
