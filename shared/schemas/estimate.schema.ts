import './zod-messages';
import * as z from 'zod/mini';
import type { EngineResult } from '../engine/result';
import { PRODUCT_CATEGORIES, branchRefSchema } from './catalogue.schema';
import { roofSystemSchema } from './roof-system.schema';

/**
 * An estimate: the engine's take-off of one schedule version with one roof system, priced from the
 * branch that offers the system. Every quantity comes from the engine; the server only rounds to
 * whole packs and multiplies by the branch's pack price. Money in integer minor units.
 */

const percent = z.number({ error: 'must be a number' }).check(z.gte(0, { error: 'must be 0 or more' }), z.lte(100, { error: 'must be at most 100' }));

/** Waste allowances in per cent, over the system's own; any may be left out. */
export const wastePctSchema = z.strictObject(z.partial(z.object({ tiles: percent, battens: percent, underlay: percent, ridge_hip: percent })).shape);
export type WastePct = z.infer<typeof wastePctSchema>;

export const createEstimateBodySchema = z
  .strictObject({
    /** A roof system from GET /api/systems. */
    system_id: z.optional(z.number().check(z.int(), z.positive())),
    /** Or a generic system typed in: the engine's roof-system input, any part left out takes its default. */
    system: z.optional(z.record(z.string(), z.unknown())),
    waste_pct: z.optional(wastePctSchema),
    /** The schedule version to estimate; the newest when left out. */
    schedule_version: z.optional(z.number().check(z.int(), z.positive())),
  })
  .check(
    z.superRefine((b, ctx) => {
      if ((b.system_id === undefined) === (b.system === undefined)) {
        ctx.addIssue({ code: 'custom', path: ['system_id'], message: 'give either system_id (a merchant’s roof system) or system (a generic one), not both' });
      }
    }),
  );
export type CreateEstimateBody = z.input<typeof createEstimateBodySchema>;

/** Which engine total a line's quantity is, so the screen can say where each figure comes from. */
export const ENGINE_FIGURES = [
  'tiles_order',
  'eaves_tiles_order',
  'top_tiles_order',
  'tile_and_half_order',
  'ridge_tiles',
  'hip_tiles',
  'ridge_and_hip_tiles',
  'batten_lengths',
  'batten_nails',
  'tile_nails',
  'clips',
  'underlay_rolls',
  'valley_m',
  'valley_units',
  'dry_verge_units',
  'ridge_end_caps',
  'hip_irons',
  'eaves_m',
  'verge_m',
  'flashing_m',
] as const;
export type EngineFigure = (typeof ENGINE_FIGURES)[number];

export const estimateLineSchema = z.object({
  id: z.number().check(z.int()),
  position: z.number().check(z.int()),
  category: z.enum(PRODUCT_CATEGORIES),
  product_id: z.nullable(z.number().check(z.int())),
  sku: z.nullable(z.string()),
  description: z.string(),
  /** What the engine says is needed, in `unit` (tiles, pieces, lengths, nails, rolls, metres). */
  quantity: z.number(),
  unit: z.string(),
  /** Units in one pack as the merchant sells it. */
  pack_size: z.number().check(z.int()),
  /** Whole packs to buy: quantity ÷ pack_size, rounded up. */
  packs: z.number().check(z.int()),
  /** Price of one pack, minor units; null for a generic system. */
  unit_price: z.nullable(z.number().check(z.int())),
  /** packs × unit_price, minor units; null for a generic system. */
  total: z.nullable(z.number().check(z.int())),
  figure: z.enum(ENGINE_FIGURES),
});
export type EstimateLine = z.infer<typeof estimateLineSchema>;

/** A part of the system the engine gives no quantity for: left for the estimator to add by hand. */
export const notCountedSchema = z.object({
  category: z.enum(PRODUCT_CATEGORIES),
  sku: z.nullable(z.string()),
  description: z.string(),
  message: z.string(),
});

export const estimateSystemRefSchema = z.object({
  source: z.enum(['catalogue', 'generic']),
  id: z.nullable(z.number().check(z.int())),
  name: z.string(),
  branch: z.nullable(branchRefSchema),
});

export const estimateTotalsSchema = z.object({
  /** Sum of the line totals, minor units; null for a generic system. */
  subtotal: z.nullable(z.number().check(z.int())),
  /** The engine's delivery weight, pallets included, kg. */
  weight_kg: z.number(),
  pallets: z.number().check(z.int()),
  loads: z.number().check(z.int()),
});

/** The engine's output as stored with the estimate (shared/engine/result.ts describes every field). */
export const engineResultSchema = z.custom<EngineResult>((v) => typeof v === 'object' && v !== null && 'totals' in v && 'faces' in v && 'engine_version' in v, { error: 'is not an engine result' });

export const estimateSchema = z.object({
  id: z.number().check(z.int()),
  project_id: z.number().check(z.int()),
  schedule: z.object({ id: z.number().check(z.int()), version: z.number().check(z.int()) }),
  system: estimateSystemRefSchema,
  /** The whole roof system the engine worked from, after defaults and the waste asked for. */
  system_input: roofSystemSchema,
  waste_pct: wastePctSchema,
  engine_version: z.string(),
  /** False when the engine has changed since: the figures are as first computed; recompute to refresh. */
  engine_current: z.boolean(),
  result: engineResultSchema,
  lines: z.array(estimateLineSchema),
  not_counted: z.array(notCountedSchema),
  totals: estimateTotalsSchema,
  cautions: z.array(z.string()),
  recomputed_from: z.nullable(z.number().check(z.int())),
  created_at: z.string(),
  created_by: z.nullable(z.object({ id: z.number().check(z.int()), name: z.string() })),
});
export type Estimate = z.infer<typeof estimateSchema>;

export const estimateSummarySchema = z.pick(estimateSchema, {
  id: true,
  project_id: true,
  schedule: true,
  system: true,
  engine_version: true,
  engine_current: true,
  totals: true,
  created_at: true,
});
export const estimateListSchema = z.object({ estimates: z.array(estimateSummarySchema) });

export const compareQuerySchema = z.object({
  a: z.coerce.number().check(z.int(), z.positive()),
  b: z.coerce.number().check(z.int(), z.positive()),
});

const compareSide = z.object({
  sku: z.nullable(z.string()),
  description: z.string(),
  quantity: z.number(),
  unit: z.string(),
  packs: z.number().check(z.int()),
  total: z.nullable(z.number().check(z.int())),
});

export const estimateComparisonSchema = z.object({
  schedule: z.object({ id: z.number().check(z.int()), version: z.number().check(z.int()) }),
  estimates: z.tuple([estimateSummarySchema, estimateSummarySchema]),
  /** One row per category, in bill order; a side is null when that estimate has no such line. */
  rows: z.array(z.object({ category: z.enum(PRODUCT_CATEGORIES), label: z.string(), a: z.nullable(compareSide), b: z.nullable(compareSide) })),
  /** b − a for the figures both sides have. */
  difference: z.object({ subtotal: z.nullable(z.number().check(z.int())), weight_kg: z.number(), pallets: z.number().check(z.int()) }),
});
export type EstimateComparison = z.infer<typeof estimateComparisonSchema>;

export const estimateParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()) });
