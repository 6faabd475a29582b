import { z } from 'zod';

/**
 * A branch's lorries: registration, payload in kg, pallet slots on the bed, and whether it has a
 * crane with the heaviest load it lifts at the reach a delivery needs (kg).
 */

const text = (max: number) =>
  z
    .string()
    .trim()
    .max(max, { error: `must be at most ${max} characters` });

export const registrationSchema = z
  .string({ error: 'must be a registration' })
  .trim()
  .min(2, { error: 'must be at least 2 characters' })
  .max(20, { error: 'must be at most 20 characters' })
  .regex(/^[A-Za-z0-9][A-Za-z0-9 -]*$/, { error: 'may hold only letters, digits, spaces and -' })
  .transform((s) => s.toUpperCase().replace(/\s+/g, ' '));

const lorryFields = {
  registration: registrationSchema,
  name: text(120).default(''),
  payload_kg: z.number({ error: 'must be a number' }).int({ error: 'must be whole kg' }).min(100, { error: 'must be at least 100 kg' }).max(44_000, { error: 'must be at most 44,000 kg' }),
  pallet_slots: z.number({ error: 'must be a number' }).int({ error: 'must be a whole number' }).min(1, { error: 'must be at least 1' }).max(60, { error: 'must be at most 60' }),
  has_crane: z.boolean().default(false),
  crane_max_kg: z.number({ error: 'must be a number' }).int({ error: 'must be whole kg' }).min(50).max(20_000).nullable().default(null),
  // The load deck inside its sides, for the deck plan: 7300 × 2450 mm for a rigid unless told.
  deck_length_mm: z.number({ error: 'must be a number' }).int({ error: 'must be whole mm' }).min(2000, { error: 'must be at least 2,000 mm' }).max(16_500, { error: 'must be at most 16,500 mm' }).default(7300),
  deck_width_mm: z.number({ error: 'must be a number' }).int({ error: 'must be whole mm' }).min(1200, { error: 'must be at least 1,200 mm' }).max(2600, { error: 'must be at most 2,600 mm' }).default(2450),
};

const craneRule = (b: { has_crane?: boolean; crane_max_kg?: number | null }, ctx: z.RefinementCtx) => {
  if (b.has_crane && !b.crane_max_kg) ctx.addIssue({ code: 'custom', path: ['crane_max_kg'], message: 'give the heaviest load the crane lifts, in kg' });
  if (b.has_crane === false && b.crane_max_kg) ctx.addIssue({ code: 'custom', path: ['crane_max_kg'], message: 'a lorry without a crane has no lifting limit' });
};

export const createLorryBodySchema = z.object(lorryFields).strict().superRefine(craneRule);
export type CreateLorryBody = z.input<typeof createLorryBodySchema>;

export const updateLorryBodySchema = z
  .object({
    registration: lorryFields.registration,
    name: text(120),
    payload_kg: lorryFields.payload_kg,
    pallet_slots: lorryFields.pallet_slots,
    has_crane: z.boolean(),
    crane_max_kg: lorryFields.crane_max_kg,
    deck_length_mm: lorryFields.deck_length_mm.unwrap(),
    deck_width_mm: lorryFields.deck_width_mm.unwrap(),
  })
  .partial()
  .strict()
  .refine((b) => Object.keys(b).length > 0, { error: 'send at least one field to change' });
export type UpdateLorryBody = z.input<typeof updateLorryBodySchema>;

export const lorrySchema = z.object({
  id: z.number().int(),
  branch_id: z.number().int(),
  registration: z.string(),
  name: z.string(),
  payload_kg: z.number().int(),
  pallet_slots: z.number().int(),
  has_crane: z.boolean(),
  crane_max_kg: z.number().int().nullable(),
  // Defaults so that a lorry read from an older server still parses.
  deck_length_mm: z.number().int().default(7300),
  deck_width_mm: z.number().int().default(2450),
  archived_at: z.string().nullable(),
});
export type Lorry = z.infer<typeof lorrySchema>;
export const lorryListSchema = z.object({ lorries: z.array(lorrySchema) });

export const driverSchema = z.object({ id: z.number().int(), name: z.string(), email: z.string() });
export const driverListSchema = z.object({ drivers: z.array(driverSchema) });
