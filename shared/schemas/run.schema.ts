import './zod-messages';
import * as z from 'zod/mini';
import type { FaceResult } from '../engine/result';
import { documentTotalsShape, pricedLineShape } from './money.schema';
import { OPENING_KINDS } from './openings.schema';
import { DELIVERY_METHODS, isoDateSchema, orderSiteSchema, orgRefSchema } from './order.schema';
import { roofSystemSchema } from './roof-system.schema';
import { EDGE_KINDS, TOP_KINDS } from './schedule.schema';

/**
 * Runs and drops. A delivery slot (lorry × day × time window) is a run; the orders booked into it are
 * its drops, in the order the yard sets (1 = the first drop off). The deck plan places every pallet of
 * every drop on the lorry's deck; the yard ticks each position as loaded, and the run is sent out when
 * all are loaded on its day. A run's id is its slot's id.
 */

export const RUN_STATUSES = ['planned', 'loading', 'loaded', 'on_the_road', 'done'] as const;
export type RunStatus = (typeof RUN_STATUSES)[number];

export const RUN_STATUS_LABELS: Record<RunStatus, string> = {
  planned: 'To load',
  loading: 'Loading',
  loaded: 'Loaded, ready to go',
  on_the_road: 'On the road',
  done: 'All dropped',
};

export const runParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()) });
export const runPositionParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()), index: z.coerce.number().check(z.int(), z.gte(0)) });
export const runDayQuerySchema = z.object({ date: isoDateSchema });
export const runWeekQuerySchema = z.object({ from: isoDateSchema });

export const runLorrySchema = z.object({
  id: z.number().check(z.int()),
  registration: z.string(),
  name: z.string(),
  has_crane: z.boolean(),
  crane_max_kg: z.nullable(z.number().check(z.int())),
  payload_kg: z.number().check(z.int()),
  pallet_slots: z.number().check(z.int()),
  deck_length_mm: z.number().check(z.int()),
  deck_width_mm: z.number().check(z.int()),
});

/** A roof face a pallet's tiles serve. */
export const palletFaceSchema = z.object({ building: z.string(), face: z.string(), tiles: z.number().check(z.int()) });

export const runDropSchema = z.object({
  order_id: z.number().check(z.int()),
  reference: z.string(),
  /** 1 = the first drop off the lorry. */
  position: z.number().check(z.int()),
  /** Pallets of this drop (a count). */
  pallets: z.number().check(z.int()),
  weight_kg: z.number(),
  status: z.string(),
  contractor: orgRefSchema,
  site_name: z.string(),
  site_address: z.string(),
  site_postcode: z.string(),
  delivery_method: z.enum(DELIVERY_METHODS),
  /** True when a line of the order is back-ordered or part-confirmed: a face will be short. */
  short: z.boolean(),
});

export const deckPositionSchema = z.object({
  /** 1 = the front of the deck (behind the cab). */
  row: z.number().check(z.int()),
  side: z.enum(['left', 'right']),
  /** 1 = the first drop off. */
  drop: z.number().check(z.int()),
  order_id: z.number().check(z.int()),
  /** The pallet's number within its order, as on its label. */
  pallet: z.number().check(z.int()),
  weight_kg: z.number(),
  faces: z.array(palletFaceSchema),
  loaded: z.boolean(),
});
export type DeckPosition = z.infer<typeof deckPositionSchema>;

export const deckWarningSchema = z.object({ code: z.string(), message: z.string() });

export const deckSchema = z.object({
  positions: z.array(deckPositionSchema),
  /** Indices into positions, the first loaded first. */
  loading_sequence: z.array(z.number().check(z.int())),
  left_kg: z.number(),
  right_kg: z.number(),
  /** Centre of gravity of the load along the deck, millimetres from the front. */
  cog_from_front_mm: z.number(),
  warnings: z.array(deckWarningSchema),
});
export type Deck = z.infer<typeof deckSchema>;

/** What the yard picks for one drop: each product and how many packs/units. */
export const pickLineSchema = z.object({
  sku: z.string(),
  description: z.string(),
  unit: z.string(),
  quantity: z.number(),
  packs: z.nullable(z.number().check(z.int())),
});

export const runSchema = z.object({
  id: z.number().check(z.int()),
  branch_id: z.number().check(z.int()),
  date: z.string(),
  time_window: z.string(),
  lorry: runLorrySchema,
  driver: z.nullable(z.object({ id: z.number().check(z.int()), name: z.string() })),
  status: z.enum(RUN_STATUSES),
  dispatched_at: z.nullable(z.string()),
  weight_kg: z.number(),
  pallets: z.number().check(z.int()),
  loaded_count: z.number().check(z.int()),
  drops: z.array(runDropSchema),
  deck: deckSchema,
  pick_list: z.array(z.object({ order_id: z.number().check(z.int()), reference: z.string(), lines: z.array(pickLineSchema) })),
});
export type Run = z.infer<typeof runSchema>;
export const runDaySchema = z.array(runSchema);

/** A week of runs for the week view: a summary per run, no deck. */
export const runWeekSchema = z.object({
  from: z.string(),
  days: z.array(
    z.object({
      date: z.string(),
      runs: z.array(
        z.object({
          id: z.number().check(z.int()),
          time_window: z.string(),
          lorry: z.object({ id: z.number().check(z.int()), registration: z.string(), has_crane: z.boolean() }),
          driver: z.nullable(z.object({ id: z.number().check(z.int()), name: z.string() })),
          drops: z.number().check(z.int()),
          weight_kg: z.number(),
          pallets: z.number().check(z.int()),
          loaded_count: z.number().check(z.int()),
          status: z.enum(RUN_STATUSES),
        }),
      ),
    }),
  ),
});
export type RunWeek = z.infer<typeof runWeekSchema>;

export const setDropOrderBodySchema = z.strictObject({ order_ids: z.array(z.number().check(z.int(), z.positive())).check(z.minLength(1), z.maxLength(100)) });

export const sendOutBodySchema = z.strictObject({ override_reason: z.optional(z.string().check(z.trim(), z.minLength(3), z.maxLength(500))) });

/** Sending a run out anyway (before its day, or not every pallet ticked): the body with its reason required. */
export const sendOutOverrideBodySchema = z.strictObject({
  override_reason: z
    .string({ error: 'Say why the lorry goes out anyway' })
    .check(z.trim(), z.minLength(3, { error: 'Say why in a few words (at least 3 letters)' }), z.maxLength(500, { error: 'Keep the reason to 500 characters' })),
});

/** One pallet, as its label's QR code opens it. */
export const palletParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()), pallet: z.coerce.number().check(z.int(), z.positive()) });
export const palletViewSchema = z.object({
  order_id: z.number().check(z.int()),
  reference: z.string(),
  site_name: z.string(),
  pallet: z.number().check(z.int()),
  pallets: z.number().check(z.int()),
  drop: z.nullable(z.number().check(z.int())),
  drops: z.nullable(z.number().check(z.int())),
  run_id: z.nullable(z.number().check(z.int())),
  /** Index into the run's deck.positions, to tick it loaded. */
  position_index: z.nullable(z.number().check(z.int())),
  weight_kg: z.number(),
  faces: z.array(palletFaceSchema),
  items: z.array(z.object({ description: z.string(), quantity: z.number(), unit: z.string() })),
  loaded: z.boolean(),
});
export type PalletView = z.infer<typeof palletViewSchema>;

// ---------------------------------------------------------------------------------------------
// The driver's day and proof of delivery

/** A roof face short of tiles on this drop, and when the rest is due. */
export const shortFaceSchema = z.object({
  building: z.string(),
  face: z.string(),
  tiles_short: z.number().check(z.int()),
  /** The follow-up order bringing the rest, when there is one. */
  follow_up_reference: z.nullable(z.string()),
  due_date: z.nullable(z.string()),
});

/** The engine's figures for one roof face as stored with the estimate (shared/engine/result.ts describes every field). */
export const faceResultSchema = z.custom<FaceResult>(
  (v) => typeof v === 'object' && v !== null && 'courses' in v && 'gauge_mm' in v && 'stacks_by_row' in v && Array.isArray((v as { stacks_by_row: unknown }).stacks_by_row),
  { error: 'is not a face result' },
);

/**
 * What the phone needs to draw one face of a crane drop with its stacks, without the estimate (a
 * driver may not read it): the face's shape from the schedule, the engine's figures for it (courses,
 * gauge, and the stacks on each loading batten, top first) and its openings. With the drop's roof
 * system the drawing places the stacks over the rafters exactly as the estimate's face drawing does.
 */
export const landingFaceDrawingSchema = z.object({
  shape: z.object({
    eaves_mm: z.number(),
    top_mm: z.number(),
    rafter_mm: z.number(),
    pitch_deg: z.number(),
    left: z.enum(EDGE_KINDS),
    right: z.enum(EDGE_KINDS),
    top: z.enum(TOP_KINDS),
  }),
  result: faceResultSchema,
  openings: z.array(z.object({ building: z.string(), face: z.string(), kind: z.enum(OPENING_KINDS), width_mm: z.number(), height_mm: z.number(), quantity: z.number().check(z.int()) })),
});
export type LandingFaceDrawing = z.infer<typeof landingFaceDrawingSchema>;

/** For a crane drop: which pallets land on which roof face. */
export const landingFaceSchema = z.object({
  building: z.string(),
  face: z.string(),
  /** Pallet numbers (as on their labels) whose tiles go onto this face. */
  pallets: z.array(z.number().check(z.int())),
  tiles: z.number().check(z.int()),
  /** The face's place in the estimate's faces (null when the order has no estimate). */
  estimate_face_index: z.nullable(z.number().check(z.int())),
  /** The face drawn with its stacks (null for spare tiles, or when the order has no estimate or the face is not on it). */
  drawing: z.nullable(landingFaceDrawingSchema),
});

export const driverDropSchema = z.object({
  order_id: z.number().check(z.int()),
  reference: z.string(),
  position: z.number().check(z.int()),
  status: z.string(),
  contractor: orgRefSchema,
  site: orderSiteSchema,
  /** Opens the phone's own maps app at the site. */
  maps_url: z.string(),
  delivery_method: z.enum(DELIVERY_METHODS),
  weight_kg: z.number(),
  pallets: z.array(
    z.object({
      n: z.number().check(z.int()),
      weight_kg: z.number(),
      faces: z.array(palletFaceSchema),
      items: z.array(z.object({ description: z.string(), quantity: z.number(), unit: z.string() })),
    }),
  ),
  lines: z.array(z.object({ line_id: z.number().check(z.int()), sku: z.string(), description: z.string(), unit: z.string(), quantity: z.number().check(z.int()) })),
  notes: z.array(z.string()),
  short_faces: z.array(shortFaceSchema),
  landing_plan: z.array(landingFaceSchema),
  /**
   * The roof system the estimate was worked with (tile, gauge rules, battens, rafter centres, roof
   * loading: stack size and every nth batten), to draw the landing plan's faces; null when none is drawn.
   */
  roof_system: z.nullable(roofSystemSchema),
  estimate_id: z.nullable(z.number().check(z.int())),
  delivered: z.boolean(),
});
export type DriverDrop = z.infer<typeof driverDropSchema>;

export const driverRunSchema = z.object({
  id: z.number().check(z.int()),
  date: z.string(),
  time_window: z.string(),
  lorry: runLorrySchema,
  status: z.enum(RUN_STATUSES),
  /** The cautions once per run; the driver records having read them. */
  cautions: z.array(z.string()),
  cautions_read_at: z.nullable(z.string()),
  drops: z.array(driverDropSchema),
});
export const driverDaySchema = z.object({ date: z.string(), driver: z.object({ id: z.number().check(z.int()), name: z.string() }), runs: z.array(driverRunSchema) });
export type DriverDay = z.infer<typeof driverDaySchema>;
export const driverDayQuerySchema = z.object({ date: z.optional(isoDateSchema) });

export const DELIVERY_LINE_OUTCOMES = ['handed_over', 'short', 'damaged'] as const;

/** The fields of a delivery record (JSON, or the text fields of the multipart form beside `signature` and `photos`). */
export const proofLineSchema = z.object({
  line_id: z.number().check(z.int(), z.positive()),
  handed_over: z.number().check(z.int(), z.gte(0)),
  short: z._default(z.number().check(z.int(), z.gte(0)), 0),
  damaged: z._default(z.number().check(z.int(), z.gte(0)), 0),
});
export const proofPositionSchema = z.object({
  lat: z.number().check(z.gte(-90), z.lte(90)),
  lng: z.number().check(z.gte(-180), z.lte(180)),
  accuracy_m: z.optional(z.number().check(z.gte(0), z.lte(100_000))),
});

export const deliveryProofSchema = z.object({
  order_id: z.number().check(z.int()),
  receiver_name: z.string(),
  delivered_at: z.string(),
  recorded_by: z.object({ id: z.number().check(z.int()), name: z.string() }),
  position: z.nullable(proofPositionSchema),
  note: z.string(),
  signature_url: z.nullable(z.string()),
  photos: z.array(z.object({ id: z.number().check(z.int()), url: z.string(), thumbnail_url: z.string(), content_type: z.string() })),
  lines: z.array(
    z.object({
      line_id: z.number().check(z.int()),
      sku: z.string(),
      description: z.string(),
      unit: z.string(),
      sent: z.number().check(z.int()),
      handed_over: z.number().check(z.int()),
      short: z.number().check(z.int()),
      damaged: z.number().check(z.int()),
    }),
  ),
  /** The draft credit note raised for shortages and damages, for the desk to issue. */
  credit_note_id: z.nullable(z.number().check(z.int())),
});
export type DeliveryProof = z.infer<typeof deliveryProofSchema>;

/**
 * The fields of a delivery record as the phone sends them (JSON, or the text fields of the multipart
 * form, where `lines` and `position` are JSON text). Each line sent is handed over, short or damaged:
 * the three add up to the packs loaded; a line left out was handed over whole.
 */
export const recordProofBodySchema = z.strictObject({
  receiver_name: z.string().check(z.trim(), z.minLength(1, { error: 'name the person who took the delivery' }), z.maxLength(120, { error: 'must be at most 120 characters' })),
  note: z.optional(z.string().check(z.trim(), z.maxLength(2000, { error: 'must be at most 2000 characters' }))),
  /** When it was handed over (the phone's clock, as it may be sent later); now when left out. */
  delivered_at: z.optional(z.iso.datetime({ error: 'must be an ISO date and time' })),
  lines: z.optional(z.array(proofLineSchema).check(z.maxLength(200))),
  position: z.optional(proofPositionSchema),
});
export type RecordProofBody = z.input<typeof recordProofBodySchema>;

/** The driver's acknowledgement of a run's cautions. */
export const cautionsReadSchema = z.object({ run_id: z.number().check(z.int()), read_at: z.string(), read_by: z.object({ id: z.number().check(z.int()), name: z.string() }) });

/** Shortages and damages of a delivery, priced at the order's prices, for the desk to issue as a credit note. */
export const creditNoteDraftSchema = z.object({
  id: z.number().check(z.int()),
  order_id: z.number().check(z.int()),
  status: z.enum(['draft', 'issued', 'dismissed']),
  currency: z.string(),
  ...documentTotalsShape,
  lines: z.array(z.object({ order_line_id: z.number().check(z.int()), sku: z.string(), description: z.string(), short: z.number().check(z.int()), damaged: z.number().check(z.int()), ...pricedLineShape })),
  notes: z.string(),
  /** The credit note issued from it, once the desk has. */
  credit_note_id: z.nullable(z.number().check(z.int())),
  created_at: z.string(),
});
export type CreditNoteDraft = z.infer<typeof creditNoteDraftSchema>;
