import './zod-messages';
import * as z from 'zod/mini';
import { PRODUCT_CATEGORIES, STOCK_STATES } from './catalogue.schema';

/**
 * Stock per branch, in packs: on hand (in the yard), reserved (promised to confirmed orders), available
 * (on hand less reserved: what the desk may still promise) and the reorder level.
 */

const packsCount = () =>
  z.number({ error: 'must be a number' }).check(z.int({ error: 'must be a whole number of packs' }), z.gte(0, { error: 'must not be negative' }), z.lte(100_000_000, { error: 'must be at most 100,000,000' }));

export const stockItemSchema = z.object({
  product_id: z.number().check(z.int()),
  sku: z.string(),
  name: z.string(),
  category: z.enum(PRODUCT_CATEGORIES),
  unit: z.string(),
  pack_size: z.number().check(z.int()),
  pack_price: z.number().check(z.int()),
  on_hand: z.number().check(z.int()),
  reserved: z.number().check(z.int()),
  available: z.number().check(z.int()),
  reorder_level: z.number().check(z.int()),
  state: z.enum(STOCK_STATES),
  updated_at: z.string(),
});
export type StockItem = z.infer<typeof stockItemSchema>;

export const stockListQuerySchema = z.object({
  q: z.optional(z.string().check(z.trim(), z.maxLength(100))),
  category: z.optional(z.enum(PRODUCT_CATEGORIES)),
  /** Only what is at or below its reorder level. */
  low: z._default(z.enum(['true', 'false']), 'false'),
});

export const stockListSchema = z.object({
  branch: z.object({ id: z.number().check(z.int()), name: z.string(), town: z.string() }),
  items: z.array(stockItemSchema),
});

/** A count or a new reorder level; on hand may never fall below what is reserved. */
export const updateStockBodySchema = z
  .strictObject({ on_hand: z.optional(packsCount()), reorder_level: z.optional(packsCount()) })
  .check(z.refine((b) => b.on_hand !== undefined || b.reorder_level !== undefined, { error: 'send on_hand or reorder_level' }));

/** The stock-count file's columns: import reads sku and on_hand, and reorder_level when present. */
export const STOCK_COLUMNS = ['sku', 'name', 'unit', 'on_hand', 'reserved', 'available', 'reorder_level'] as const;
export const STOCK_REQUIRED = ['sku', 'on_hand'] as const;
