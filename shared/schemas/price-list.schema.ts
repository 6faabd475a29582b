import './zod-messages';
import * as z from 'zod/mini';
import { PRODUCT_CATEGORIES, SYSTEM_ROLES, TECHNICAL_SCHEMAS, branchRefSchema, productSummarySchema, systemSettingsSchema } from './catalogue.schema';

/**
 * A merchant's own catalogue: products (SKU, unit, pack size, pack weight, category, tax rate and the
 * technical fields the engine reads), roof systems per branch, and each branch's price list. Money in
 * integer minor units, tax rates in basis points (2000 = 20 %), weights in kg, stock in packs.
 */

const text = (max: number) => z.string().check(z.trim(), z.maxLength(max, { error: `must be at most ${max} characters` }));

/** SKUs are the merchant's own codes: letters, digits and - _ . / only, so they survive every spreadsheet. */
export const skuSchema = z
  .string({ error: 'must be a product code' })
  .check(
    z.trim(),
    z.minLength(1, { error: 'must not be empty' }),
    z.maxLength(40, { error: 'must be at most 40 characters' }),
    z.regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, { error: 'may hold only letters, digits and - _ . / and must start with a letter or digit' }),
  );

/** 0 to 100 %, in basis points. */
export const taxRateBpSchema = z
  .number({ error: 'must be a number' })
  .check(z.int({ error: 'must be whole basis points (2000 = 20 %)' }), z.gte(0, { error: 'must not be negative' }), z.lte(10_000, { error: 'must be at most 100 %' }));

/**
 * One side of the pallet the product travels on, for the lorry's deck plan: 1200 × 1000 mm for the
 * usual pallet unless told (common practice; 1200 × 800 mm is the other common size).
 */
export const palletSideSchema = z.number({ error: 'must be a number' }).check(z.int({ error: 'must be whole mm' }), z.gte(300, { error: 'must be at least 300 mm' }), z.lte(2_500, { error: 'must be at most 2,500 mm' }));

export const DEFAULT_PALLET_MM = { length: 1200, width: 1000 } as const;

const productFields = {
  sku: skuSchema,
  name: text(160).check(z.minLength(1, { error: 'must not be empty' })),
  category: z.enum(PRODUCT_CATEGORIES, { error: `must be one of ${PRODUCT_CATEGORIES.join(', ')}` }),
  unit: text(20).check(z.minLength(1, { error: 'must not be empty' })),
  pack_size: z.number({ error: 'must be a number' }).check(z.int({ error: 'must be a whole number' }), z.gte(1, { error: 'must be at least 1' }), z.lte(100_000)),
  pack_weight_kg: z.number({ error: 'must be a number' }).check(z.gte(0, { error: 'must not be negative' }), z.lte(5_000, { error: 'must be at most 5,000 kg' })),
  tax_rate_bp: taxRateBpSchema,
  technical: z.record(z.string(), z.unknown()),
  pallet_length_mm: palletSideSchema,
  pallet_width_mm: palletSideSchema,
};

/** A product's technical fields must be what the engine reads for its category (tile, batten, nail...). */
function checkTechnical(p: { category?: (typeof PRODUCT_CATEGORIES)[number]; technical?: Record<string, unknown> }, ctx: z.core.$RefinementCtx) {
  if (!p.category || !p.technical) return;
  const parsed = TECHNICAL_SCHEMAS[p.category].safeParse(p.technical);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) ctx.addIssue({ code: 'custom', path: ['technical', ...issue.path.map(String)], message: issue.message });
  }
}

export const createProductBodySchema = z
  .strictObject({
    ...productFields,
    tax_rate_bp: z._default(productFields.tax_rate_bp, 2000),
    technical: z._default(productFields.technical, {}),
    pallet_length_mm: z._default(palletSideSchema, DEFAULT_PALLET_MM.length),
    pallet_width_mm: z._default(palletSideSchema, DEFAULT_PALLET_MM.width),
  })
  .check(z.superRefine(checkTechnical));
export type CreateProductBody = z.input<typeof createProductBodySchema>;

/** Any subset; a new category needs technical fields to match it. */
export const updateProductBodySchema = z.strictObject(z.partial(z.object(productFields)).shape).check(z.refine((b) => Object.keys(b).length > 0, { error: 'send at least one field to change' }));
export type UpdateProductBody = z.input<typeof updateProductBodySchema>;

export const productBranchSchema = z.object({
  branch_id: z.number().check(z.int()),
  branch_name: z.string(),
  pack_price: z.number().check(z.int()),
  on_hand: z.number().check(z.int()),
  reserved: z.number().check(z.int()),
  available: z.number().check(z.int()),
  reorder_level: z.number().check(z.int()),
});

/** A product as its merchant edits it: the summary everyone sees, with its tax, technical figures, pallet and branches. */
export const productSchema = z.extend(productSummarySchema, {
  tax_rate_bp: z.number().check(z.int()),
  technical: z.record(z.string(), z.unknown()),
  /** The pallet it travels on, mm. */
  pallet_length_mm: z.number().check(z.int()),
  pallet_width_mm: z.number().check(z.int()),
  /** Where it is sold, at what price, with what stock. */
  branches: z.array(productBranchSchema),
  archived_at: z.nullable(z.string()),
  created_at: z.string(),
  updated_at: z.string(),
});
export type Product = z.infer<typeof productSchema>;

export const productListQuerySchema = z.object({
  q: z.optional(z.string().check(z.trim(), z.maxLength(100))),
  category: z.optional(z.enum(PRODUCT_CATEGORIES)),
  archived: z._default(z.enum(['false', 'true', 'all']), 'false'),
});
export const productListSchema = z.object({ products: z.array(productSchema) });

/** Selling a product at a branch, or changing its price there. */
export const branchPriceBodySchema = z.strictObject({
  pack_price: z.number({ error: 'must be a number' }).check(z.int({ error: 'must be whole minor units' }), z.gte(0, { error: 'must not be negative' }), z.lte(100_000_000)),
});

export const branchProductParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()), productId: z.coerce.number().check(z.int(), z.positive()) });

// Roof systems: a tile and the accessories that go with it, at one branch.

const roofSystemFields = {
  name: text(160).check(z.minLength(1, { error: 'must not be empty' })),
  description: text(500),
  settings: systemSettingsSchema,
  /** Product per role; tile, ridge, batten, batten_nail, tile_nail and underlay make a whole roof. */
  components: z.partialRecord(z.enum(SYSTEM_ROLES), z.number().check(z.int(), z.positive())),
};
export const roofSystemBodySchema = z.strictObject({
  branch_id: z.number().check(z.int(), z.positive()),
  ...roofSystemFields,
  description: z._default(roofSystemFields.description, ''),
  settings: z._default(roofSystemFields.settings, {}),
});
export type RoofSystemBody = z.input<typeof roofSystemBodySchema>;
/** A change names only what changes: no defaults here, or a rename would wipe the description and settings. */
export const updateRoofSystemBodySchema = z.strictObject(z.partial(z.object(roofSystemFields)).shape);

export const merchantRoofSystemSchema = z.object({
  id: z.number().check(z.int()),
  name: z.string(),
  description: z.string(),
  branch: branchRefSchema,
  settings: z.record(z.string(), z.unknown()),
  components: z.array(z.object({ role: z.enum(SYSTEM_ROLES), product_id: z.number().check(z.int()), sku: z.string(), name: z.string() })),
  /** Whether contractors can estimate with it now, and what stops it when not. */
  offerable: z.boolean(),
  problems: z.array(z.string()),
  archived_at: z.nullable(z.string()),
});
export type MerchantRoofSystem = z.infer<typeof merchantRoofSystemSchema>;
export const merchantRoofSystemListSchema = z.object({ systems: z.array(merchantRoofSystemSchema) });
export const roofSystemListQuerySchema = z.object({ branch_id: z.optional(z.coerce.number().check(z.int(), z.positive())) });

// Price lists and stock counts as files.

/** The largest price-list or stock file accepted: 5 MiB. */
export const MAX_SHEET_BYTES = 5 * 1024 * 1024;
export const MAX_SHEET_ROWS = 10_000;
export const SHEET_FILE_FIELD = 'file';
export const SHEET_CONTENT_TYPES = ['text/csv', 'application/csv', 'text/plain', 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'] as const;

/**
 * The price list's columns. `price` is one pack in major units with up to two decimals (12.80);
 * `tax_rate` is a percentage (20). Import reads sku, price and, when present, tax_rate; the others
 * are there for people and are not changed by an import.
 */
export const PRICE_LIST_COLUMNS = ['sku', 'name', 'category', 'unit', 'pack_size', 'pack_weight_kg', 'tax_rate', 'price'] as const;
export const PRICE_LIST_REQUIRED = ['sku', 'price'] as const;

/** What an import changed; a rejected file answers 422 invalid_sheet with {row, column, message} per problem. */
export const sheetImportResultSchema = z.object({
  rows: z.number().check(z.int()),
  updated: z.number().check(z.int()),
  added: z.number().check(z.int()),
  unchanged: z.number().check(z.int()),
  warnings: z.array(z.object({ code: z.string(), message: z.string() })),
});
export type SheetImportResult = z.infer<typeof sheetImportResultSchema>;

export const sheetExportQuerySchema = z.object({ format: z._default(z.enum(['csv', 'xlsx']), 'csv') });
