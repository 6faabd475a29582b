import { z } from 'zod';
import { PRODUCT_CATEGORIES, SYSTEM_ROLES, TECHNICAL_SCHEMAS, branchRefSchema, productSummarySchema, systemSettingsSchema } from './catalogue.schema';

/**
 * A merchant's own catalogue: products (SKU, unit, pack size, pack weight, category, tax rate and the
 * technical fields the engine reads), roof systems per branch, and each branch's price list. Money in
 * integer minor units, tax rates in basis points (2000 = 20 %), weights in kg, stock in packs.
 */

const text = (max: number) =>
  z
    .string()
    .trim()
    .max(max, { error: `must be at most ${max} characters` });

/** SKUs are the merchant's own codes: letters, digits and - _ . / only, so they survive every spreadsheet. */
export const skuSchema = z
  .string({ error: 'must be a product code' })
  .trim()
  .min(1, { error: 'must not be empty' })
  .max(40, { error: 'must be at most 40 characters' })
  .regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, { error: 'may hold only letters, digits and - _ . / and must start with a letter or digit' });

/** 0 to 100 %, in basis points. */
export const taxRateBpSchema = z.number({ error: 'must be a number' }).int({ error: 'must be whole basis points (2000 = 20 %)' }).min(0, { error: 'must not be negative' }).max(10_000, { error: 'must be at most 100 %' });

/**
 * One side of the pallet the product travels on, for the lorry's deck plan: 1200 × 1000 mm for the
 * usual pallet unless told (common practice; 1200 × 800 mm is the other common size).
 */
export const palletSideSchema = z.number({ error: 'must be a number' }).int({ error: 'must be whole mm' }).min(300, { error: 'must be at least 300 mm' }).max(2_500, { error: 'must be at most 2,500 mm' });

export const DEFAULT_PALLET_MM = { length: 1200, width: 1000 } as const;

const productFields = {
  sku: skuSchema,
  name: text(160).min(1, { error: 'must not be empty' }),
  category: z.enum(PRODUCT_CATEGORIES, { error: `must be one of ${PRODUCT_CATEGORIES.join(', ')}` }),
  unit: text(20).min(1, { error: 'must not be empty' }),
  pack_size: z.number({ error: 'must be a number' }).int({ error: 'must be a whole number' }).min(1, { error: 'must be at least 1' }).max(100_000),
  pack_weight_kg: z.number({ error: 'must be a number' }).min(0, { error: 'must not be negative' }).max(5_000, { error: 'must be at most 5,000 kg' }),
  tax_rate_bp: taxRateBpSchema,
  technical: z.record(z.string(), z.unknown()),
  pallet_length_mm: palletSideSchema,
  pallet_width_mm: palletSideSchema,
};

/** A product's technical fields must be what the engine reads for its category (tile, batten, nail...). */
function checkTechnical(p: { category?: (typeof PRODUCT_CATEGORIES)[number]; technical?: Record<string, unknown> }, ctx: z.RefinementCtx) {
  if (!p.category || !p.technical) return;
  const parsed = TECHNICAL_SCHEMAS[p.category].safeParse(p.technical);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) ctx.addIssue({ code: 'custom', path: ['technical', ...issue.path.map(String)], message: issue.message });
  }
}

export const createProductBodySchema = z
  .object({
    ...productFields,
    tax_rate_bp: productFields.tax_rate_bp.default(2000),
    technical: productFields.technical.default({}),
    pallet_length_mm: palletSideSchema.default(DEFAULT_PALLET_MM.length),
    pallet_width_mm: palletSideSchema.default(DEFAULT_PALLET_MM.width),
  })
  .strict()
  .superRefine(checkTechnical);
export type CreateProductBody = z.input<typeof createProductBodySchema>;

/** Any subset; a new category needs technical fields to match it. */
export const updateProductBodySchema = z
  .object(productFields)
  .partial()
  .strict()
  .refine((b) => Object.keys(b).length > 0, { error: 'send at least one field to change' });
export type UpdateProductBody = z.input<typeof updateProductBodySchema>;

export const productBranchSchema = z.object({
  branch_id: z.number().int(),
  branch_name: z.string(),
  pack_price: z.number().int(),
  on_hand: z.number().int(),
  reserved: z.number().int(),
  available: z.number().int(),
  reorder_level: z.number().int(),
});

/** A product as its merchant edits it: the summary everyone sees, with its tax, technical figures, pallet and branches. */
export const productSchema = productSummarySchema.extend({
  tax_rate_bp: z.number().int(),
  technical: z.record(z.string(), z.unknown()),
  /** The pallet it travels on, mm. */
  pallet_length_mm: z.number().int(),
  pallet_width_mm: z.number().int(),
  /** Where it is sold, at what price, with what stock. */
  branches: z.array(productBranchSchema),
  archived_at: z.string().nullable(),
  created_at: z.string(),
  updated_at: z.string(),
});
export type Product = z.infer<typeof productSchema>;

export const productListQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  category: z.enum(PRODUCT_CATEGORIES).optional(),
  archived: z.enum(['false', 'true', 'all']).default('false'),
});
export const productListSchema = z.object({ products: z.array(productSchema) });

/** Selling a product at a branch, or changing its price there. */
export const branchPriceBodySchema = z
  .object({
    pack_price: z.number({ error: 'must be a number' }).int({ error: 'must be whole minor units' }).min(0, { error: 'must not be negative' }).max(100_000_000),
  })
  .strict();

export const branchProductParamsSchema = z.object({ id: z.coerce.number().int().positive(), productId: z.coerce.number().int().positive() });

// Roof systems: a tile and the accessories that go with it, at one branch.

const roofSystemFields = {
  name: text(160).min(1, { error: 'must not be empty' }),
  description: text(500),
  settings: systemSettingsSchema,
  /** Product per role; tile, ridge, batten, batten_nail, tile_nail and underlay make a whole roof. */
  components: z.partialRecord(z.enum(SYSTEM_ROLES), z.number().int().positive()),
};
export const roofSystemBodySchema = z
  .object({
    branch_id: z.number().int().positive(),
    ...roofSystemFields,
    description: roofSystemFields.description.default(''),
    settings: roofSystemFields.settings.default({}),
  })
  .strict();
export type RoofSystemBody = z.input<typeof roofSystemBodySchema>;
/** A change names only what changes: no defaults here, or a rename would wipe the description and settings. */
export const updateRoofSystemBodySchema = z.object(roofSystemFields).partial().strict();

export const merchantRoofSystemSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  description: z.string(),
  branch: branchRefSchema,
  settings: z.record(z.string(), z.unknown()),
  components: z.array(z.object({ role: z.enum(SYSTEM_ROLES), product_id: z.number().int(), sku: z.string(), name: z.string() })),
  /** Whether contractors can estimate with it now, and what stops it when not. */
  offerable: z.boolean(),
  problems: z.array(z.string()),
  archived_at: z.string().nullable(),
});
export type MerchantRoofSystem = z.infer<typeof merchantRoofSystemSchema>;
export const merchantRoofSystemListSchema = z.object({ systems: z.array(merchantRoofSystemSchema) });
export const roofSystemListQuerySchema = z.object({ branch_id: z.coerce.number().int().positive().optional() });

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
  rows: z.number().int(),
  updated: z.number().int(),
  added: z.number().int(),
  unchanged: z.number().int(),
  warnings: z.array(z.object({ code: z.string(), message: z.string() })),
});
export type SheetImportResult = z.infer<typeof sheetImportResultSchema>;

export const sheetExportQuerySchema = z.object({ format: z.enum(['csv', 'xlsx']).default('csv') });
