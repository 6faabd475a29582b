import './zod-messages';
import * as z from 'zod/mini';

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

const text = (max: number) => z.string().check(z.trim(), z.maxLength(max, { error: `must be at most ${max} characters` }));
const required = (max: number) => text(max).check(z.minLength(1, { error: 'is required' }));

export const buildingInputSchema = z.object({
  name: required(100),
  kind: z._default(z.enum(BUILDING_KINDS, { error: 'must be building or plot' }), 'building'),
  notes: z._default(text(500), ''),
});

const phone = text(40).check(
  z.refine((v) => v === '' || /^[0-9+()\s-]{6,40}$/.test(v), {
    error: 'must be a phone number (digits, spaces, + ( ) -)',
  }),
);

const buildingsSchema = z.array(buildingInputSchema).check(
  z.maxLength(500, { error: 'at most 500 buildings or plots' }),
  z.superRefine((list, ctx) => {
    const seen = new Set<string>();
    list.forEach((b, i) => {
      const key = b.name.toLowerCase();
      if (seen.has(key)) ctx.addIssue({ code: 'custom', path: [i, 'name'], message: `'${b.name}' is given twice` });
      seen.add(key);
    });
  }),
);

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
  reference: z._default(editableFields.reference, ''),
  site_postcode: z._default(editableFields.site_postcode, ''),
  contact_name: z._default(editableFields.contact_name, ''),
  contact_phone: z._default(editableFields.contact_phone, ''),
  vehicle_access: z._default(editableFields.vehicle_access, 'any'),
  crane_lift: z._default(editableFields.crane_lift, 'unknown'),
  overhead_lines: z._default(editableFields.overhead_lines, 'unknown'),
  set_down_place: z._default(editableFields.set_down_place, ''),
  access_notes: z._default(editableFields.access_notes, ''),
  buildings: z._default(editableFields.buildings, []),
});
export type CreateProjectBody = z.input<typeof createProjectBodySchema>;

/**
 * An edit sends only what changes; buildings, when sent, replace the whole list. It names the revision
 * it was made on: someone else's save in between makes it stale (409).
 */
export const updateProjectBodySchema = z
  .extend(z.partial(z.object(editableFields)), { revision: z.number({ error: 'is required: the revision of the site you edited' }).check(z.int(), z.positive()) })
  .check(z.refine((b) => Object.keys(b).some((k) => k !== 'revision'), { error: 'send at least one field to change' }));
export type UpdateProjectBody = z.input<typeof updateProjectBodySchema>;

export const PROJECT_SORTS = ['name', 'created_at', 'updated_at', 'site_address'] as const;

export const projectListQuerySchema = z.object({
  q: z.optional(z.string().check(z.trim(), z.maxLength(100))),
  sort: z._default(z.enum(PROJECT_SORTS), 'updated_at'),
  dir: z._default(z.enum(['asc', 'desc']), 'desc'),
  page: z._default(z.coerce.number().check(z.int(), z.gte(1)), 1),
  page_size: z._default(z.coerce.number().check(z.int(), z.gte(1), z.lte(100)), 25),
  archived: z._default(z.enum(['false', 'true', 'all']), 'false'),
});
export type ProjectListQuery = z.input<typeof projectListQuerySchema>;

export const buildingSchema = z.object({
  id: z.number().check(z.int()),
  name: z.string(),
  kind: z.enum(BUILDING_KINDS),
  notes: z.string(),
});

export const projectSummarySchema = z.object({
  id: z.number().check(z.int()),
  name: z.string(),
  reference: z.string(),
  site_address: z.string(),
  site_postcode: z.string(),
  contact_name: z.string(),
  contact_phone: z.string(),
  building_count: z.number().check(z.int()),
  /** The schedule in use: the newest version, or null before the first import. */
  schedule: z.nullable(z.object({ id: z.number().check(z.int()), version: z.number().check(z.int()), face_count: z.number().check(z.int()) })),
  estimate_count: z.number().check(z.int()),
  archived_at: z.nullable(z.string()),
  created_at: z.string(),
  updated_at: z.string(),
});

export const projectSchema = z.extend(projectSummarySchema, {
  /** Raised by every edit; an edit names the revision it was made on. */
  revision: z.number().check(z.int()),
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
  total: z.number().check(z.int()),
  page: z.number().check(z.int()),
  page_size: z.number().check(z.int()),
});
export type ProjectList = z.infer<typeof projectListSchema>;

export const projectParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()) });
