import * as z from 'zod/mini';
import type { ProductCategory } from '../../../../shared/schemas/catalogue.schema';
import { createProductBodySchema } from '../../../../shared/schemas/price-list.schema';
import type { Product } from '../../../../shared/schemas/price-list.schema';
import { numberOrText, textOf } from './form-values';

export interface TechnicalField {
  key: string;
  label: string;
  hint?: string;
}

const weightEach: TechnicalField = { key: 'weight_kg', label: 'Weight of one piece (kg)' };

/**
 * The technical fields the engine reads for each category but the tile (which has its own section),
 * in the units of shared/schemas/catalogue.schema.ts: lengths in mm, weights in kg, nails and clips in grams.
 */
export const TECHNICAL_FIELDS: Record<Exclude<ProductCategory, 'tile'>, readonly TechnicalField[]> = {
  ridge: [{ key: 'cover_mm', label: 'Cover along the ridge (mm)', hint: 'The length one ridge tile covers once lapped or butted.' }, weightEach],
  hip: [{ key: 'cover_mm', label: 'Cover along the hip (mm)', hint: 'The length one hip tile covers once lapped or butted.' }, weightEach],
  batten: [
    { key: 'stock_length_mm', label: 'Stock length (mm)', hint: 'One length as delivered, e.g. 4800.' },
    { key: 'width_mm', label: 'Width (mm)' },
    { key: 'depth_mm', label: 'Depth (mm)' },
    { key: 'kg_per_m', label: 'Weight per metre (kg)' },
  ],
  batten_nail: [
    { key: 'length_mm', label: 'Nail length (mm)' },
    { key: 'diameter_mm', label: 'Shank diameter (mm)' },
    { key: 'nail_g', label: 'Weight of one nail (g)' },
  ],
  tile_nail: [
    { key: 'length_mm', label: 'Nail length (mm)' },
    { key: 'diameter_mm', label: 'Shank diameter (mm)' },
    { key: 'nail_g', label: 'Weight of one nail (g)' },
  ],
  clip: [{ key: 'clip_g', label: 'Weight of one clip (g)' }],
  underlay: [
    { key: 'roll_width_mm', label: 'Roll width (mm)' },
    { key: 'roll_length_mm', label: 'Roll length (mm)' },
    { key: 'roll_kg', label: 'Weight of one roll (kg)' },
  ],
  valley: [{ key: 'weight_kg', label: 'Weight of one length (kg)', hint: 'A valley lining is sold in lengths: its unit is the metre and its pack size the metres in one length.' }],
  eaves_tile: [{ key: 'weight_kg', label: 'Weight of one eaves tile (kg)' }],
  top_tile: [{ key: 'weight_kg', label: 'Weight of one top tile (kg)' }],
  tile_and_half: [{ key: 'weight_kg', label: 'Weight of one tile-and-a-half (kg)' }],
  valley_trough: [
    { key: 'unit_length_mm', label: 'Length of one unit (mm)', hint: 'As delivered, e.g. 3000.' },
    { key: 'lap_mm', label: 'Lap onto the next unit (mm)', hint: 'E.g. 150.' },
    { key: 'weight_kg', label: 'Weight of one unit (kg)' },
  ],
  dry_verge: [{ key: 'weight_kg', label: 'Weight of one unit (kg)', hint: 'A roof system with a dry verge product has dry verges: one unit a course on each verge.' }],
  ridge_end_cap: [weightEach],
  hip_iron: [weightEach],
  eaves_vent: [{ key: 'weight_kg', label: 'Weight of one length or roll (kg)', hint: 'Sold by the metre: its unit is the metre and its pack size the metres in one length or roll. Priced on the length of every eaves.' }],
  verge_undercloak: [
    { key: 'weight_kg', label: 'Weight of one length (kg)', hint: 'Sold by the metre: its unit is the metre and its pack size the metres in one length. Priced on the raking length of mortar verges only.' },
  ],
  flashing: [
    {
      key: 'weight_kg',
      label: 'Weight of one length or roll (kg)',
      hint: 'Sold by the metre: its unit is the metre and its pack size the metres in one length or roll. Priced on side and top abutments, aprons and back gutters together.',
    },
  ],
  accessory: [],
};

/** Form field name of a technical value; server details name the same path (`technical.length_mm`). */
export const technicalField = (...path: (string | number)[]) => ['technical', ...path].join('.');

/** The headlap band rows on the form, by position: their count is the highest index typed plus one. */
function bandCount(values: Record<string, string>): number {
  let count = 0;
  for (const key of Object.keys(values)) {
    const m = /^technical\.headlap_mm\.(\d+)\./.exec(key);
    if (m) count = Math.max(count, Number(m[1]) + 1);
  }
  return count;
}

function readTile(values: Record<string, string>, existing: Record<string, unknown> | null): Record<string, unknown> {
  const v = (...path: (string | number)[]) => values[technicalField(...path)];
  const tile: Record<string, unknown> = {};
  // The engine's optional label is not on the form; keep it rather than lose it on a save.
  if (existing && typeof existing.name === 'string') tile.name = existing.name;
  tile.kind = v('kind') || undefined;
  tile.length_mm = numberOrText(v('length_mm'));
  tile.width_mm = numberOrText(v('width_mm'));
  const cover = { min: numberOrText(v('cover_width_mm', 'min')), nominal: numberOrText(v('cover_width_mm', 'nominal')), max: numberOrText(v('cover_width_mm', 'max')) };
  if (cover.min !== undefined || cover.nominal !== undefined || cover.max !== undefined) tile.cover_width_mm = cover;
  tile.headlap_mm = Array.from({ length: bandCount(values) }, (_, i) => ({ from_pitch_deg: numberOrText(v('headlap_mm', i, 'from_pitch_deg')), min_mm: numberOrText(v('headlap_mm', i, 'min_mm')) }));
  if (v('bond')) tile.bond = v('bond');
  if (v('halves_per_tile')) tile.halves_per_tile = numberOrText(v('halves_per_tile'));
  tile.weight_kg = numberOrText(v('weight_kg'));
  tile.per_pallet = numberOrText(v('per_pallet'));
  const nails = numberOrText(v('nails_per_tile'));
  if (nails !== undefined) tile.nails_per_tile = nails;
  return tile;
}

function readTechnical(category: string | undefined, values: Record<string, string>, existing: Product | null): unknown {
  const same = existing && existing.category === category ? existing.technical : null;
  if (category === 'tile') return readTile(values, same);
  // An accessory's technical fields are free-form and not on the form: keep what it has.
  if (category === 'accessory') return same ?? {};
  const fields = TECHNICAL_FIELDS[category as Exclude<ProductCategory, 'tile'>];
  if (!fields) return {};
  return Object.fromEntries(fields.map((f) => [f.key, numberOrText(values[technicalField(f.key)])]));
}

/** A tax rate typed as a percentage (20, 17.5) in basis points (2000, 1750), as the API keeps it. */
function taxRateBp(text: string | undefined): number | string | undefined {
  const pct = numberOrText(text);
  return typeof pct === 'number' ? Math.round(pct * 100) : pct;
}

/**
 * The product form read into the product body and checked with the server's own schema, technical
 * fields included. A changed product sends every field, so the same check applies to it.
 */
export function productFormSchema(existing: Product | null) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.string()),
      z.transform((values): unknown => ({
        sku: textOf(values.sku) ?? '',
        name: textOf(values.name) ?? '',
        category: values.category || undefined,
        unit: textOf(values.unit) ?? '',
        pack_size: numberOrText(values.pack_size),
        pack_weight_kg: numberOrText(values.pack_weight_kg),
        tax_rate_bp: taxRateBp(values.tax_rate_bp),
        pallet_length_mm: numberOrText(values.pallet_length_mm),
        pallet_width_mm: numberOrText(values.pallet_width_mm),
        technical: readTechnical(values.category, values, existing),
      })),
    ),
    createProductBodySchema,
  );
}

export interface HeadlapBandText {
  from_pitch_deg: string;
  min_mm: string;
}

const str = (value: unknown) => (typeof value === 'number' || typeof value === 'string' ? String(value) : '');
const record = (value: unknown): Record<string, unknown> => (value && typeof value === 'object' && !Array.isArray(value) ? (value as Record<string, unknown>) : {});

/** A stored product's technical value as the text its field starts with. */
export function technicalText(product: Product | null, ...path: string[]): string {
  let node: unknown = product?.technical;
  for (const key of path) node = record(node)[key];
  return str(node);
}

/** A stored tile's headlap bands as text rows; a new tile starts with one empty band. */
export function headlapBandsText(product: Product | null): HeadlapBandText[] {
  const bands = product?.category === 'tile' && Array.isArray(product.technical.headlap_mm) ? product.technical.headlap_mm : [];
  if (bands.length === 0) return [{ from_pitch_deg: '', min_mm: '' }];
  return bands.map((b) => ({ from_pitch_deg: str(record(b).from_pitch_deg), min_mm: str(record(b).min_mm) }));
}

/** Basis points shown as a percentage: 2000 → "20", 1750 → "17.5". */
export function taxPercentText(bp: number): string {
  return String(bp / 100);
}
