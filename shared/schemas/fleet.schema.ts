import './zod-messages';
import * as z from 'zod/mini';

/**
 * A branch's lorries: registration, payload in kg, pallet slots on the bed, and whether it has a
 * crane with the heaviest load it lifts at the reach a delivery needs (kg).
 */

const text = (max: number) => z.string().check(z.trim(), z.maxLength(max, { error: `must be at most ${max} characters` }));

export const registrationSchema = z.pipe(
  z
    .string({ error: 'must be a registration' })
    .check(
      z.trim(),
      z.minLength(2, { error: 'must be at least 2 characters' }),
      z.maxLength(20, { error: 'must be at most 20 characters' }),
      z.regex(/^[A-Za-z0-9][A-Za-z0-9 -]*$/, { error: 'may hold only letters, digits, spaces and -' }),
    ),
  z.transform((s) => s.toUpperCase().replace(/\s+/g, ' ')),
);

const lorryFields = {
  registration: registrationSchema,
  name: z._default(text(120), ''),
  payload_kg: z.number({ error: 'must be a number' }).check(z.int({ error: 'must be whole kg' }), z.gte(100, { error: 'must be at least 100 kg' }), z.lte(44_000, { error: 'must be at most 44,000 kg' })),
  pallet_slots: z.number({ error: 'must be a number' }).check(z.int({ error: 'must be a whole number' }), z.gte(1, { error: 'must be at least 1' }), z.lte(60, { error: 'must be at most 60' })),
  has_crane: z._default(z.boolean(), false),
  crane_max_kg: z._default(z.nullable(z.number({ error: 'must be a number' }).check(z.int({ error: 'must be whole kg' }), z.gte(50), z.lte(20_000))), null),
  // The load deck inside its sides, for the deck plan: 7300 × 2450 mm for a rigid unless told.
  deck_length_mm: z._default(
    z.number({ error: 'must be a number' }).check(z.int({ error: 'must be whole mm' }), z.gte(2000, { error: 'must be at least 2,000 mm' }), z.lte(16_500, { error: 'must be at most 16,500 mm' })),
    7300,
  ),
  deck_width_mm: z._default(
    z.number({ error: 'must be a number' }).check(z.int({ error: 'must be whole mm' }), z.gte(1200, { error: 'must be at least 1,200 mm' }), z.lte(2600, { error: 'must be at most 2,600 mm' })),
    2450,
  ),
};

const craneRule = (b: { has_crane?: boolean; crane_max_kg?: number | null }, ctx: z.core.$RefinementCtx) => {
  if (b.has_crane && !b.crane_max_kg) ctx.addIssue({ code: 'custom', path: ['crane_max_kg'], message: 'give the heaviest load the crane lifts, in kg' });
  if (b.has_crane === false && b.crane_max_kg) ctx.addIssue({ code: 'custom', path: ['crane_max_kg'], message: 'a lorry without a crane has no lifting limit' });
};

export const createLorryBodySchema = z.strictObject(lorryFields).check(z.superRefine(craneRule));
export type CreateLorryBody = z.input<typeof createLorryBodySchema>;

export const updateLorryBodySchema = z
  .strictObject(
    z.partial(
      z.object({
        registration: lorryFields.registration,
        name: text(120),
        payload_kg: lorryFields.payload_kg,
        pallet_slots: lorryFields.pallet_slots,
        has_crane: z.boolean(),
        crane_max_kg: lorryFields.crane_max_kg,
        deck_length_mm: lorryFields.deck_length_mm.def.innerType,
        deck_width_mm: lorryFields.deck_width_mm.def.innerType,
      }),
    ).shape,
  )
  .check(z.refine((b) => Object.keys(b).length > 0, { error: 'send at least one field to change' }));
export type UpdateLorryBody = z.input<typeof updateLorryBodySchema>;

export const lorrySchema = z.object({
  id: z.number().check(z.int()),
  branch_id: z.number().check(z.int()),
  registration: z.string(),
  name: z.string(),
  payload_kg: z.number().check(z.int()),
  pallet_slots: z.number().check(z.int()),
  has_crane: z.boolean(),
  crane_max_kg: z.nullable(z.number().check(z.int())),
  // Defaults so that a lorry read from an older server still parses.
  deck_length_mm: z._default(z.number().check(z.int()), 7300),
  deck_width_mm: z._default(z.number().check(z.int()), 2450),
  archived_at: z.nullable(z.string()),
});
export type Lorry = z.infer<typeof lorrySchema>;
export const lorryListSchema = z.object({ lorries: z.array(lorrySchema) });

export const driverSchema = z.object({ id: z.number().check(z.int()), name: z.string(), email: z.string() });
export const driverListSchema = z.object({ drivers: z.array(driverSchema) });
