import './zod-messages';
import * as z from 'zod/mini';
import { DELIVERY_METHODS, isoDateSchema, orderSiteSchema, orgRefSchema, timeWindowSchema } from './order.schema';

/**
 * The delivery calendar: each lorry has slots (a day and a time window). An order booked into a slot
 * takes the weight and pallets of its engine delivery plan; a slot never holds more than its lorry's
 * payload (kg) or pallet slots.
 */

export const slotBookingSchema = z.object({
  order_id: z.number().check(z.int()),
  reference: z.string(),
  status: z.string(),
  contractor: orgRefSchema,
  site_name: z.string(),
  delivery_method: z.enum(DELIVERY_METHODS),
  weight_kg: z.number(),
  pallets: z.number().check(z.int()),
  heaviest_pallet_kg: z.number(),
});

export const slotSchema = z.object({
  id: z.number().check(z.int()),
  branch_id: z.number().check(z.int()),
  date: z.string(),
  time_window: z.string(),
  lorry: z.object({ id: z.number().check(z.int()), registration: z.string(), name: z.string(), has_crane: z.boolean(), crane_max_kg: z.nullable(z.number().check(z.int())) }),
  driver: z.nullable(z.object({ id: z.number().check(z.int()), name: z.string() })),
  payload_kg: z.number().check(z.int()),
  pallet_slots: z.number().check(z.int()),
  booked_kg: z.number(),
  booked_pallets: z.number().check(z.int()),
  remaining_kg: z.number(),
  remaining_pallets: z.number().check(z.int()),
  bookings: z.array(slotBookingSchema),
});
export type Slot = z.infer<typeof slotSchema>;

export const slotsQuerySchema = z.object({ date: isoDateSchema });
export const slotDayParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()) });
export const slotDaySchema = z.object({
  branch: z.object({ id: z.number().check(z.int()), name: z.string(), town: z.string() }),
  date: z.string(),
  slots: z.array(slotSchema),
});

export const createSlotBodySchema = z.strictObject({
  lorry_id: z.number().check(z.int(), z.positive()),
  date: isoDateSchema,
  time_window: timeWindowSchema,
  driver_id: z.optional(z.nullable(z.number().check(z.int(), z.positive()))),
});

/** A calendar of slots: every listed window, for each lorry of the branch (or those named), on each day from..to (at most 62 days). */
export const generateSlotsBodySchema = z
  .strictObject({
    from: isoDateSchema,
    to: isoDateSchema,
    windows: z.array(timeWindowSchema).check(z.minLength(1), z.maxLength(6)),
    lorry_ids: z.optional(z.array(z.number().check(z.int(), z.positive())).check(z.maxLength(50))),
    /** ISO weekdays, 1 = Monday … 7 = Sunday; Monday to Friday when left out. */
    weekdays: z._default(z.array(z.number().check(z.int(), z.gte(1), z.lte(7))).check(z.minLength(1), z.maxLength(7)), [1, 2, 3, 4, 5]),
  })
  .check(
    z.refine((b) => b.from <= b.to, { path: ['to'], error: 'must be on or after from' }),
    z.refine((b) => (Date.parse(b.to) - Date.parse(b.from)) / 86_400_000 <= 62, { path: ['to'], error: 'a calendar covers at most 62 days at a time' }),
  );

export const generateSlotsResultSchema = z.object({ created: z.number().check(z.int()), skipped: z.number().check(z.int()) });

export const updateSlotBodySchema = z
  .strictObject({ driver_id: z.optional(z.nullable(z.number().check(z.int(), z.positive()))), time_window: z.optional(timeWindowSchema) })
  .check(z.refine((b) => b.driver_id !== undefined || b.time_window !== undefined, { error: 'send driver_id or time_window' }));

/** One pallet on a driver's loading sheet, in the order it goes onto the lorry (first on = last off). */
export const loadingPalletSchema = z.object({
  load_position: z.number().check(z.int()),
  n: z.number().check(z.int()),
  kind: z.enum(['tiles', 'accessories']),
  weight_kg: z.number(),
  tiles: z.number().check(z.int()),
  /** The roof faces its tiles serve, e.g. "Alder · Front (plots 1–12) 180 tiles"; "spare" for the waste allowance. */
  faces: z.array(z.object({ building: z.string(), face: z.string(), tiles: z.number().check(z.int()) })),
  items: z.array(z.object({ item: z.string(), quantity: z.number(), weight_kg: z.number() })),
});

export const loadingStopSchema = z.object({
  order_id: z.number().check(z.int()),
  reference: z.string(),
  status: z.string(),
  contractor: orgRefSchema,
  site: orderSiteSchema,
  delivery_method: z.enum(DELIVERY_METHODS),
  weight_kg: z.number(),
  pallets: z.array(loadingPalletSchema),
  lines: z.array(z.object({ line_id: z.number().check(z.int()), sku: z.string(), description: z.string(), unit: z.string(), quantity: z.number().check(z.int()) })),
  /** Where and how to set down or load the roof, from the site record and the order. */
  notes: z.array(z.string()),
  cautions: z.array(z.string()),
});

export const loadingSheetSchema = z.object({
  date: z.string(),
  driver: z.object({ id: z.number().check(z.int()), name: z.string() }),
  runs: z.array(
    z.object({
      slot_id: z.number().check(z.int()),
      time_window: z.string(),
      lorry: z.object({ id: z.number().check(z.int()), registration: z.string(), has_crane: z.boolean(), crane_max_kg: z.nullable(z.number().check(z.int())) }),
      weight_kg: z.number(),
      pallets: z.number().check(z.int()),
      /** Stops in delivery order; the lorry is loaded in the reverse order so the first stop's pallets come off first. */
      stops: z.array(loadingStopSchema),
    }),
  ),
});
export type LoadingSheet = z.infer<typeof loadingSheetSchema>;
export const loadingSheetQuerySchema = z.object({ date: z.optional(isoDateSchema), driver_id: z.optional(z.coerce.number().check(z.int(), z.positive())) });
