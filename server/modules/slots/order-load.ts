import { planDelivery, type Accessory, type AccessoryItem, type Pallet } from '../../../shared/engine/delivery';
import { MAX_DELIVERY_PALLETS } from '../../../shared/engine/defaults';
import type { EngineResult } from '../../../shared/engine/result';
import { parseRoofSystem } from '../../../shared/engine/roof-system';
import type { ProductCategory } from '../../../shared/schemas/catalogue.schema';
import type { RoofSystem } from '../../../shared/schemas/roof-system.schema';

/** What one order puts on a lorry: gross weight (kg, pallets included), pallets, the heaviest pallet and the pallet list. */
export interface OrderLoad {
  weight_kg: number;
  pallets: number;
  heaviest_pallet_kg: number;
  plan: { pallets: Pallet[] };
}

export interface LoadLine {
  category: ProductCategory;
  /** Packs this delivery sends. */
  packs: number;
  pack_size: number;
  pack_weight_kg: number;
}

/** Engine items for the categories it palletises: needed first (off first) or last (ridge and hip). */
const FIRST_OFF: Partial<Record<ProductCategory, AccessoryItem>> = {
  underlay: 'underlay_rolls',
  batten: 'battens',
  batten_nail: 'batten_nails',
  tile_nail: 'tile_nails',
  valley_trough: 'valley_units',
  hip_iron: 'hip_irons',
  dry_verge: 'dry_verge_units',
};
const LAST_OFF: Partial<Record<ProductCategory, AccessoryItem>> = { ridge: 'ridge_tiles', hip: 'hip_tiles', ridge_end_cap: 'ridge_end_caps' };
/** Double-lap special tiles travel on the tile pallets, after the full tiles. */
const WITH_TILES: Partial<Record<ProductCategory, AccessoryItem>> = { eaves_tile: 'eaves_tiles', top_tile: 'top_tiles', tile_and_half: 'tile_and_half' };

const round1 = (v: number) => Math.round(v * 10) / 10;

/**
 * The engine's delivery plan for what an order sends (not what the estimate once asked for): its tile
 * packs over the estimate's faces, its accessories by their own pack weights, made up into pallets by
 * the estimate's roof system (pallet size, tare, heaviest pallet). Clips, valley linings and other
 * accessories the engine does not count ride on the accessory pallets under their own names (products sold by the metre in metres). Without
 * an estimate the engine's default system makes the pallets.
 */
export function orderLoad(lines: readonly LoadLine[], estimate: { system_input: RoofSystem; result: EngineResult } | null): OrderLoad {
  const system = estimate?.system_input ?? (parseRoofSystem({}) as { ok: true; system: RoofSystem }).system;
  let tiles = 0;
  let tileKg = 0;
  const firstOff: Accessory[] = [];
  const lastOff: Accessory[] = [];
  const withTiles: Accessory[] = [];
  for (const l of lines) {
    if (l.packs <= 0) continue;
    const units = l.packs * l.pack_size;
    const unitKg = l.pack_size > 0 ? l.pack_weight_kg / l.pack_size : 0;
    if (l.category === 'tile') {
      tiles += units;
      tileKg += l.packs * l.pack_weight_kg;
      continue;
    }
    const special = WITH_TILES[l.category];
    if (special) {
      withTiles.push({ item: special, quantity: units, unit_kg: unitKg });
      continue;
    }
    const last = LAST_OFF[l.category];
    if (last) {
      lastOff.push({ item: last, quantity: units, unit_kg: unitKg });
      continue;
    }
    // The engine's packer uses the item name only as a label, so the ones it does not count keep their category.
    firstOff.push({ item: (FIRST_OFF[l.category] ?? l.category) as AccessoryItem, quantity: units, unit_kg: unitKg });
  }
  const tileSystem: RoofSystem = tiles > 0 ? { ...system, tile: { ...system.tile, weight_kg: tileKg / tiles } } : system;
  const faces = (estimate?.result.faces ?? []).map((f) => ({ building: f.building, face: f.face, tiles: f.tiles, quantity: f.quantity }));
  const plan = planDelivery({ tilesOrdered: tiles, faces, withTiles, firstOff, lastOff }, tileSystem, MAX_DELIVERY_PALLETS);
  const heaviest = plan.pallets.reduce((m, p) => Math.max(m, p.weight_kg), 0);
  return { weight_kg: round1(plan.weight_kg), pallets: plan.tile_pallets + plan.accessory_pallets, heaviest_pallet_kg: heaviest, plan: { pallets: plan.pallets } };
}
