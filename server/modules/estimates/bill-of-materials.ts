import type { EngineResult, Totals } from '../../../shared/engine/result';
import { CATEGORY_LABELS, type ProductCategory, type SystemRole } from '../../../shared/schemas/catalogue.schema';
import type { EngineFigure } from '../../../shared/schemas/estimate.schema';
import type { RoofSystem } from '../../../shared/schemas/roof-system.schema';

/** A line before it is stored: the engine's quantity, the product that meets it and its price. */
export interface BillLine {
  category: ProductCategory;
  product_id: number | null;
  sku: string | null;
  description: string;
  quantity: number;
  unit: string;
  pack_size: number;
  packs: number;
  unit_price: number | null;
  total: number | null;
  figure: EngineFigure;
}

export interface NotCounted {
  category: ProductCategory;
  sku: string | null;
  description: string;
  message: string;
}

export interface PricedComponent {
  product: { id: number; sku: string; name: string; unit: string; pack_size: number };
  pack_price: number;
}

/** Metres to the centimetre, as the engine gives them, without the float slips of a sum. */
const cm = (m: number) => Math.round(m * 100) / 100;

/**
 * Where each line's quantity comes from in the engine's totals (and the system it was worked out with),
 * and the unit it is counted in. A product's unit is the same thing counted (a tile or a slate, a ridge
 * piece, a batten length, a nail, a roll, a metre of valley, eaves, verge or flashing).
 */
const FIGURES: { category: SystemRole; figure: EngineFigure; unit: string; value: (t: Totals, s: RoofSystem) => number }[] = [
  { category: 'tile', figure: 'tiles_order', unit: 'tile', value: (t) => t.tiles_order },
  { category: 'eaves_tile', figure: 'eaves_tiles_order', unit: 'tile', value: (t) => t.eaves_tiles_order ?? 0 },
  { category: 'top_tile', figure: 'top_tiles_order', unit: 'tile', value: (t) => t.top_tiles_order ?? 0 },
  { category: 'tile_and_half', figure: 'tile_and_half_order', unit: 'tile', value: (t) => t.tile_and_half_order ?? 0 },
  { category: 'ridge', figure: 'ridge_tiles', unit: 'piece', value: (t) => t.ridge_tiles },
  { category: 'hip', figure: 'hip_tiles', unit: 'piece', value: (t) => t.hip_tiles },
  { category: 'batten', figure: 'batten_lengths', unit: 'length', value: (t) => t.batten_lengths },
  { category: 'batten_nail', figure: 'batten_nails', unit: 'nail', value: (t) => t.batten_nails },
  { category: 'tile_nail', figure: 'tile_nails', unit: 'nail', value: (t) => t.tile_nails },
  { category: 'clip', figure: 'clips', unit: 'clip', value: (t) => t.clips },
  { category: 'underlay', figure: 'underlay_rolls', unit: 'roll', value: (t) => t.underlay_rolls },
  // Trough valleys are ordered as units; only a lined valley is ordered by the metre.
  { category: 'valley', figure: 'valley_m', unit: 'm', value: (t) => ((t.valley_units ?? 0) > 0 ? 0 : t.valley_m) },
  { category: 'valley_trough', figure: 'valley_units', unit: 'piece', value: (t) => t.valley_units ?? 0 },
  { category: 'dry_verge', figure: 'dry_verge_units', unit: 'piece', value: (t) => t.dry_verge_units ?? 0 },
  { category: 'ridge_end_cap', figure: 'ridge_end_caps', unit: 'piece', value: (t) => t.ridge_end_caps ?? 0 },
  { category: 'hip_iron', figure: 'hip_irons', unit: 'piece', value: (t) => t.hip_irons ?? 0 },
  { category: 'eaves_vent', figure: 'eaves_m', unit: 'm', value: (t) => t.eaves_m ?? 0 },
  // A mortar verge is bedded on an undercloak strip; a dry verge unit needs none (its units are their own line).
  { category: 'verge_undercloak', figure: 'verge_m', unit: 'm', value: (t, s) => (s.verge.kind === 'dry' ? 0 : (t.verge_m ?? 0)) },
  // Side and top abutments, aprons and back gutters: one flashing product by the metre covers the four runs.
  {
    category: 'flashing',
    figure: 'flashing_m',
    unit: 'm',
    value: (t) => (t.flashings ? cm(t.flashings.side_abutment_m + t.flashings.top_abutment_m + t.flashings.apron_m + t.flashings.back_gutter_m) : 0),
  },
];

/** Whole packs for a quantity; the small slack keeps 2000 nails in boxes of 1000 at two boxes. */
export function packsFor(quantity: number, packSize: number): number {
  if (quantity <= 0) return 0;
  return Math.ceil(quantity / packSize - 1e-9);
}

const mm = (v: number) => `${Math.round(v)}`;

function genericDescription(category: SystemRole, s: RoofSystem): string {
  switch (category) {
    case 'tile':
      return `${s.tile.kind === 'single_lap' ? 'Single-lap' : 'Double-lap'} tile ${mm(s.tile.length_mm)} × ${mm(s.tile.width_mm)} mm`;
    case 'ridge':
      return `Ridge tile, ${mm(s.ridge.cover_mm)} mm cover`;
    case 'hip':
      return `Hip tile, ${mm(s.hip.cover_mm)} mm cover`;
    case 'batten':
      return `Batten, ${mm(s.batten.stock_length_mm)} mm lengths`;
    case 'underlay':
      return `Underlay, ${mm(s.underlay.roll_width_mm)} mm × ${Math.round(s.underlay.roll_length_mm / 1000)} m rolls`;
    case 'eaves_tile':
      return `Eaves tile (short), for a ${mm(s.tile.length_mm)} × ${mm(s.tile.width_mm)} mm tile`;
    case 'top_tile':
      return `Top tile (short), for a ${mm(s.tile.length_mm)} × ${mm(s.tile.width_mm)} mm tile`;
    case 'tile_and_half':
      return `Tile-and-a-half, ${mm(s.tile.length_mm)} × ${mm(s.tile.width_mm * 1.5)} mm`;
    case 'valley_trough':
      return `Valley trough unit, ${mm(s.valley.unit_length_mm)} mm (${mm(s.valley.lap_mm)} mm lap)`;
    case 'eaves_vent':
      return 'Eaves ventilation strip or comb filler, by the metre along the eaves';
    case 'verge_undercloak':
      return 'Verge undercloak strip, by the metre along the mortar verges';
    case 'flashing':
      return 'Flashing, by the metre: abutments, aprons and back gutters';
    default:
      return CATEGORY_LABELS[category];
  }
}

/**
 * The bill of materials of an engine result. With a merchant's system each quantity is met by the
 * system's product in whole packs at the branch's pack price; a system without a hip product lays
 * its ridge piece on the hips, so the two counts share one line. Without products (a generic system)
 * the lines carry the engine's quantities and no price. Counted items with no product (valleys on a
 * system without a valley lining) are listed apart.
 */
export function billOfMaterials(result: EngineResult, system: RoofSystem, components: Map<SystemRole, PricedComponent> | null): { lines: BillLine[]; not_counted: NotCounted[] } {
  const t = result.totals;
  const lines: BillLine[] = [];
  const notCounted: NotCounted[] = [];

  for (const f of FIGURES) {
    let quantity = f.value(t, system);
    let figure = f.figure;
    if (components && f.category === 'hip' && !components.has('hip')) continue;
    if (components && f.category === 'ridge' && !components.has('hip') && t.hip_tiles > 0) {
      quantity += t.hip_tiles;
      figure = 'ridge_and_hip_tiles';
    }
    if (!(quantity > 0)) continue;

    if (!components) {
      lines.push({
        category: f.category,
        product_id: null,
        sku: null,
        description: genericDescription(f.category, system),
        quantity,
        unit: f.unit,
        pack_size: 1,
        packs: packsFor(quantity, 1),
        unit_price: null,
        total: null,
        figure,
      });
      continue;
    }

    const c = components.get(f.category);
    if (!c) {
      notCounted.push({
        category: f.category,
        sku: null,
        description: CATEGORY_LABELS[f.category],
        message: `the roof needs ${quantity} ${f.unit} of ${CATEGORY_LABELS[f.category].toLowerCase()}, but this system has no such product: add it to the order by hand`,
      });
      continue;
    }
    const packs = packsFor(quantity, c.product.pack_size);
    lines.push({
      category: f.category,
      product_id: c.product.id,
      sku: c.product.sku,
      description: c.product.name,
      quantity,
      unit: c.product.unit,
      pack_size: c.product.pack_size,
      packs,
      unit_price: c.pack_price,
      total: packs * c.pack_price,
      figure,
    });
  }

  return { lines, not_counted: notCounted };
}
