import * as z from 'zod/mini';
import { createLorryBodySchema } from '../../../../shared/schemas/fleet.schema';

/** A typed whole number ("12 000", "12,000" read as 12000); anything else is left as text so the schema names the field. */
export function wholeNumberOrText(text: string | undefined): number | string | null {
  const t = (text ?? '').trim().replace(/[\s,]/g, '');
  if (t === '') return null;
  return /^\d+$/.test(t) ? Number(t) : t;
}

/**
 * The lorry form read into the lorry body: payload and crane limit in kg, pallet slots as a count.
 * The crane limit is only read when the crane box is ticked, so unticking it clears the limit.
 */
export const lorryFormSchema = z.pipe(
  z.pipe(
    z.record(z.string(), z.string()),
    z.transform((values): unknown => {
      const hasCrane = values.has_crane === 'on';
      const payload = wholeNumberOrText(values.payload_kg);
      const slots = wholeNumberOrText(values.pallet_slots);
      return {
        registration: values.registration ?? '',
        name: values.name ?? '',
        payload_kg: payload ?? undefined,
        pallet_slots: slots ?? undefined,
        has_crane: hasCrane,
        crane_max_kg: hasCrane ? wholeNumberOrText(values.crane_max_kg) : null,
        deck_length_mm: wholeNumberOrText(values.deck_length_mm) ?? undefined,
        deck_width_mm: wholeNumberOrText(values.deck_width_mm) ?? undefined,
      };
    }),
  ),
  createLorryBodySchema,
);
