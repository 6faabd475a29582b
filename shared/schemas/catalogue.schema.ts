import './zod-messages';
import * as z from 'zod/mini';
import { roofSystemSchema } from './roof-system.schema';

/**
 * The merchants' catalogue: products with the technical fields the engine reads, roof systems (a tile
 * and the accessories that go with it) and each branch's price and stock. Lengths in mm, weights in
 * kg (nails and clips in grams each), money in integer minor units, stock in packs.
 */

/**
 * The parts of a roof system; every role but hip, clip, valley and the fittings is needed for a whole
 * roof. A system with a dry verge product has dry verges; one with a valley trough has trough valleys;
 * eaves tiles, top tiles and tiles-and-a-half are priced as their own products when the system names them.
 * Valley lining, eaves ventilation, verge undercloak and flashing are sold by the metre: they price the
 * engine's metre totals (`valley_m`, `eaves_m`, `verge_m` with mortar verges, the flashing runs summed).
 */
export const SYSTEM_ROLES = [
  'tile',
  'eaves_tile',
  'top_tile',
  'tile_and_half',
  'ridge',
  'hip',
  'batten',
  'batten_nail',
  'tile_nail',
  'clip',
  'underlay',
  'valley',
  'valley_trough',
  'dry_verge',
  'ridge_end_cap',
  'hip_iron',
  'eaves_vent',
  'verge_undercloak',
  'flashing',
] as const;
export type SystemRole = (typeof SYSTEM_ROLES)[number];

/** What a product can be: any part of a roof system, or an accessory sold beside it. */
export const PRODUCT_CATEGORIES = [...SYSTEM_ROLES, 'accessory'] as const;
export type ProductCategory = (typeof PRODUCT_CATEGORIES)[number];

/** Words shown for each category, in the order a bill of materials lists them. */
export const CATEGORY_LABELS: Record<ProductCategory, string> = {
  tile: 'Tiles',
  eaves_tile: 'Eaves tiles',
  top_tile: 'Top tiles',
  tile_and_half: 'Tile-and-a-half',
  ridge: 'Ridge',
  hip: 'Hip',
  batten: 'Battens',
  batten_nail: 'Batten nails',
  tile_nail: 'Tile nails',
  clip: 'Clips',
  underlay: 'Underlay',
  valley: 'Valley lining',
  valley_trough: 'Valley troughs',
  dry_verge: 'Dry verge units',
  ridge_end_cap: 'Ridge end caps',
  hip_iron: 'Hip irons',
  eaves_vent: 'Eaves ventilation',
  verge_undercloak: 'Verge undercloak',
  flashing: 'Flashing',
  accessory: 'Accessories',
};

export const REQUIRED_SYSTEM_ROLES: readonly SystemRole[] = ['tile', 'ridge', 'batten', 'batten_nail', 'tile_nail', 'underlay'];

const positive = () => z.number({ error: 'must be a number' }).check(z.positive({ error: 'must be more than 0' }));
const whole = (min: number) => z.number({ error: 'must be a number' }).check(z.int({ error: 'must be a whole number' }), z.gte(min, { error: `must be at least ${min}` }));

/** A tile's technical fields are the engine's own tile input. */
export const tileTechnicalSchema = roofSystemSchema.shape.tile.def.innerType;
export const ridgeTechnicalSchema = z.object({ cover_mm: positive(), weight_kg: positive() });
export const battenTechnicalSchema = z.object({
  stock_length_mm: positive(),
  width_mm: positive(),
  depth_mm: positive(),
  kg_per_m: positive(),
});
export const nailTechnicalSchema = z.object({ length_mm: positive(), diameter_mm: positive(), nail_g: positive() });
export const clipTechnicalSchema = z.object({ clip_g: positive() });
export const underlayTechnicalSchema = z.object({ roll_width_mm: positive(), roll_length_mm: positive(), roll_kg: positive() });
/** A valley lining is sold in lengths: its unit is the metre and its pack_size the metres in one length. */
export const valleyTechnicalSchema = z.object({ weight_kg: positive() });
/**
 * A product sold by the metre (eaves ventilation strip or comb filler, verge undercloak strip, flashing):
 * its unit is the metre, its pack_size the metres in one length or roll, and weight_kg the weight of one.
 */
export const byTheMetreTechnicalSchema = z.object({ weight_kg: positive() });
/** A piece sold by the count whose weight the engine needs (special tiles, fittings). */
export const pieceTechnicalSchema = z.object({ weight_kg: positive() });
/** A preformed valley trough unit: its length and the lap onto the next. */
export const valleyTroughTechnicalSchema = z.object({ unit_length_mm: positive(), lap_mm: z.number().check(z.gte(0)), weight_kg: positive() });

export const TECHNICAL_SCHEMAS = {
  tile: tileTechnicalSchema,
  ridge: ridgeTechnicalSchema,
  hip: ridgeTechnicalSchema,
  batten: battenTechnicalSchema,
  batten_nail: nailTechnicalSchema,
  tile_nail: nailTechnicalSchema,
  clip: clipTechnicalSchema,
  underlay: underlayTechnicalSchema,
  valley: valleyTechnicalSchema,
  eaves_tile: pieceTechnicalSchema,
  top_tile: pieceTechnicalSchema,
  tile_and_half: pieceTechnicalSchema,
  valley_trough: valleyTroughTechnicalSchema,
  dry_verge: pieceTechnicalSchema,
  ridge_end_cap: pieceTechnicalSchema,
  hip_iron: pieceTechnicalSchema,
  eaves_vent: byTheMetreTechnicalSchema,
  verge_undercloak: byTheMetreTechnicalSchema,
  flashing: byTheMetreTechnicalSchema,
  accessory: z.catchall(z.object({}), z.unknown()),
} satisfies Record<ProductCategory, z.ZodMiniType>;

export type TileTechnical = z.input<typeof tileTechnicalSchema>;
export type RidgeTechnical = z.infer<typeof ridgeTechnicalSchema>;
export type BattenTechnical = z.infer<typeof battenTechnicalSchema>;
export type NailTechnical = z.infer<typeof nailTechnicalSchema>;
export type UnderlayTechnical = z.infer<typeof underlayTechnicalSchema>;

/**
 * What a roof system sets beyond its products: how it is set out, battened, fixed, wasted, loaded and
 * carried. Any part may be left out and takes the engine's default.
 */
export const systemSettingsSchema = z.partial(
  z.object({
    setting_out: z.partial(roofSystemSchema.shape.setting_out.def.innerType),
    rafter_spacing_mm: positive(),
    batten: z.partial(z.object({ min_supports: whole(2), min_length_mm: z.number().check(z.gte(0)) })),
    underlay: z.partial(z.object({ head_lap_mm: z.number().check(z.gte(0)) })),
    fixing: z.partial(
      z.object({
        rule: z.enum(['every_tile', 'perimeter_and_alternate_courses']),
        clips: z.partial(z.object({ eaves: z.boolean(), verges: z.boolean(), every_tile_from_pitch_deg: z.nullable(z.number().check(z.gt(0), z.lte(90))) })),
      }),
    ),
    waste_pct: z.partial(z.object({ tiles: z.number(), battens: z.number(), underlay: z.number(), ridge_hip: z.number() })),
    roof_loading: z.partial(z.object({ stack_size: whole(1), every_nth_batten: whole(1) })),
    truck: z.partial(z.object({ payload_kg: positive(), pallet_slots: whole(1), pallet_tare_kg: z.number().check(z.gte(0)), max_pallet_kg: positive() })),
  }),
);
export type SystemSettings = z.infer<typeof systemSettingsSchema>;

/** How much of a product a branch can send, as the contractor sees it (stock figures stay with the merchant). */
export const STOCK_STATES = ['in_stock', 'low', 'out_of_stock'] as const;
export type StockState = (typeof STOCK_STATES)[number];

export const productSummarySchema = z.object({
  id: z.number().check(z.int()),
  sku: z.string(),
  name: z.string(),
  category: z.enum(PRODUCT_CATEGORIES),
  unit: z.string(),
  pack_size: z.number().check(z.int()),
  pack_weight_kg: z.number(),
});
export type ProductSummary = z.infer<typeof productSummarySchema>;

export const branchRefSchema = z.object({
  id: z.number().check(z.int()),
  name: z.string(),
  town: z.string(),
  merchant: z.object({ id: z.number().check(z.int()), name: z.string() }),
});
export type BranchRef = z.infer<typeof branchRefSchema>;

/** GET /api/merchant-branches: every branch a contractor can order from or ask for a quote. */
export const merchantBranchesListSchema = z.object({ branches: z.array(branchRefSchema) });

export const systemComponentSchema = z.object({
  role: z.enum(SYSTEM_ROLES),
  product: productSummarySchema,
  /** Price of one pack at this branch, minor units. */
  unit_price: z.number().check(z.int()),
  stock: z.enum(STOCK_STATES),
});

/** A roof system as a branch offers it. `system` is the engine's input built from the products. */
export const roofSystemOfferSchema = z.object({
  id: z.number().check(z.int()),
  name: z.string(),
  description: z.string(),
  branch: branchRefSchema,
  tile: tileTechnicalSchema,
  system: roofSystemSchema,
  components: z.array(systemComponentSchema),
  prices: z.record(z.string(), z.number().check(z.int())),
});
export type RoofSystemOffer = z.infer<typeof roofSystemOfferSchema>;

export const systemsListQuerySchema = z.object({
  branch_id: z.optional(z.coerce.number().check(z.int(), z.positive())),
  merchant_id: z.optional(z.coerce.number().check(z.int(), z.positive())),
  kind: z.optional(z.enum(['single_lap', 'double_lap'])),
});
export const systemsListSchema = z.object({ systems: z.array(roofSystemOfferSchema) });
