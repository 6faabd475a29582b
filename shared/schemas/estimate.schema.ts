import { z } from 'zod';
import type { EngineResult } from '../engine/result';
import { PRODUCT_CATEGORIES, branchRefSchema } from './catalogue.schema';
import { roofSystemSchema } from './roof-system.schema';

/**
 * An estimate: the engine's take-off of one schedule version with one roof system, priced from the
 * branch that offers the system. Every quantity comes from the engine; the server only rounds to
 * whole packs and multiplies by the branch's pack price. Money in integer minor units.
 */

const percent = z.number({ error: 'must be a number' }).min(0, { error: 'must be 0 or more' }).max(100, { error: 'must be at most 100' });

/** Waste allowances in per cent, over the system's own; any may be left out. */
export const wastePctSchema = z.object({ tiles: percent, battens: percent, underlay: percent, ridge_hip: percent }).partial().strict();
export type WastePct = z.infer<typeof wastePctSchema>;

export const createEstimateBodySchema = z
  .object({
    /** A roof system from GET /api/systems. */
    system_id: z.number().int().positive().optional(),
    /** Or a generic system typed in: the engine's roof-system input, any part left out takes its default. */
    system: z.record(z.string(), z.unknown()).optional(),
    waste_pct: wastePctSchema.optional(),
    /** The schedule version to estimate; the newest when left out. */
    schedule_version: z.number().int().positive().optional(),
  })
  .strict()
  .superRefine((b, ctx) => {
    if ((b.system_id === undefined) === (b.system === undefined)) {
      ctx.addIssue({ code: 'custom', path: ['system_id'], message: 'give either system_id (a merchant’s roof system) or system (a generic one), not both' });
    }
  });
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
] as const;
export type EngineFigure = (typeof ENGINE_FIGURES)[number];

export const estimateLineSchema = z.object({
  id: z.number().int(),
  position: z.number().int(),
  category: z.enum(PRODUCT_CATEGORIES),
  product_id: z.number().int().nullable(),
  sku: z.string().nullable(),
  description: z.string(),
  /** What the engine says is needed, in `unit` (tiles, pieces, lengths, nails, rolls, metres). */
  quantity: z.number(),
  unit: z.string(),
  /** Units in one pack as the merchant sells it. */
  pack_size: z.number().int(),
  /** Whole packs to buy: quantity ÷ pack_size, rounded up. */
  packs: z.number().int(),
  /** Price of one pack, minor units; null for a generic system. */
  unit_price: z.number().int().nullable(),
  /** packs × unit_price, minor units; null for a generic system. */
  total: z.number().int().nullable(),
  figure: z.enum(ENGINE_FIGURES),
});
export type EstimateLine = z.infer<typeof estimateLineSchema>;

/** A part of the system the engine gives no quantity for: left for the estimator to add by hand. */
export const notCountedSchema = z.object({
  category: z.enum(PRODUCT_CATEGORIES),
  sku: z.string().nullable(),
  description: z.string(),
  message: z.string(),
});

export const estimateSystemRefSchema = z.object({
  source: z.enum(['catalogue', 'generic']),
  id: z.number().int().nullable(),
  name: z.string(),
  branch: branchRefSchema.nullable(),
});

export const estimateTotalsSchema = z.object({
  /** Sum of the line totals, minor units; null for a generic system. */
  subtotal: z.number().int().nullable(),
  /** The engine's delivery weight, pallets included, kg. */
  weight_kg: z.number(),
  pallets: z.number().int(),
  loads: z.number().int(),
});

/** The engine's output as stored with the estimate (shared/engine/result.ts describes every field). */
export const engineResultSchema = z.custom<EngineResult>((v) => typeof v === 'object' && v !== null && 'totals' in v && 'faces' in v && 'engine_version' in v, { error: 'is not an engine result' });

export const estimateSchema = z.object({
  id: z.number().int(),
  project_id: z.number().int(),
  schedule: z.object({ id: z.number().int(), version: z.number().int() }),
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
  recomputed_from: z.number().int().nullable(),
  created_at: z.string(),
  created_by: z.object({ id: z.number().int(), name: z.string() }).nullable(),
});
export type Estimate = z.infer<typeof estimateSchema>;

export const estimateSummarySchema = estimateSchema.pick({
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
  a: z.coerce.number().int().positive(),
  b: z.coerce.number().int().positive(),
});

const compareSide = z.object({
  sku: z.string().nullable(),
  description: z.string(),
  quantity: z.number(),
  unit: z.string(),
  packs: z.number().int(),
  total: z.number().int().nullable(),
});

export const estimateComparisonSchema = z.object({
  schedule: z.object({ id: z.number().int(), version: z.number().int() }),
  estimates: z.tuple([estimateSummarySchema, estimateSummarySchema]),
  /** One row per category, in bill order; a side is null when that estimate has no such line. */
  rows: z.array(z.object({ category: z.enum(PRODUCT_CATEGORIES), label: z.string(), a: compareSide.nullable(), b: compareSide.nullable() })),
  /** b − a for the figures both sides have. */
  difference: z.object({ subtotal: z.number().int().nullable(), weight_kg: z.number(), pallets: z.number().int() }),
});
export type EstimateComparison = z.infer<typeof estimateComparisonSchema>;

export const estimateParamsSchema = z.object({ id: z.coerce.number().int().positive() });
