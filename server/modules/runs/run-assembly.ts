import { deckPalletKey, planDeck, type DeckDrop, type DeckPlan } from '../../../shared/engine/deck-plan';
import { CATEGORY_LABELS, type ProductCategory } from '../../../shared/schemas/catalogue.schema';
import { orderReference } from '../../../shared/schemas/order.schema';
import type { PalletView, Run, RunStatus } from '../../../shared/schemas/run.schema';
import type { Db } from '../../db/knex';
import type { DropRow, PickRow, RunRow, runsRepository } from './runs.repository';

/** A run with what the documents need beside the API's shape: each drop's site and the deck's geometry. */
export interface RunDetail {
  run: Run;
  row: RunRow;
  drops: DropRow[];
  deck: DeckPlan;
  /** Each drop's product names by category, to name what is on its pallets. */
  names: Map<number, ProductNames>;
}

const round1 = (v: number) => Math.round(v * 10) / 10;
const SHORT_LINE = new Set(['part_agreed', 'back_ordered']);

function runStatus(row: RunRow, drops: DropRow[], pallets: number, loaded: number): RunStatus {
  if (drops.length > 0 && drops.every((d) => d.status === 'delivered')) return 'done';
  if (row.sent_out_at || drops.some((d) => d.status === 'on_the_road' || d.status === 'delivered')) return 'on_the_road';
  if (pallets > 0 && loaded === pallets) return 'loaded';
  if (loaded > 0) return 'loading';
  return 'planned';
}

/** Builds runs (with their deck plans and pick lists) from the rows of several runs at once. */
export async function assemble(repo: ReturnType<typeof runsRepository>, rows: RunRow[], trx?: Db): Promise<RunDetail[]> {
  const ids = rows.map((r) => r.id);
  const [drops, loaded] = await Promise.all([repo.drops(ids, trx), repo.loaded(ids, trx)]);
  const orderIds = drops.map((d) => d.order_id);
  const [picks, footprints] = await Promise.all([repo.pickLines(orderIds, trx), repo.footprints(orderIds, trx)]);
  const dropsOf = new Map<number, DropRow[]>();
  for (const d of drops) dropsOf.set(d.slot_id, [...(dropsOf.get(d.slot_id) ?? []), d]);
  const loadedOf = new Map<number, Set<string>>();
  for (const l of loaded) {
    const set = loadedOf.get(l.slot_id) ?? new Set<string>();
    set.add(deckPalletKey(l.order_id, l.pallet));
    loadedOf.set(l.slot_id, set);
  }
  const picksOf = new Map<number, PickRow[]>();
  for (const p of picks) picksOf.set(p.order_id, [...(picksOf.get(p.order_id) ?? []), p]);

  return rows.map((row) => {
    const runDrops = dropsOf.get(row.id) ?? [];
    const deckDrops: DeckDrop[] = runDrops.map((d) => {
      const fp = footprints.get(d.order_id);
      return {
        order_id: d.order_id,
        reference: orderReference(d.order_id),
        delivery_method: d.delivery_method,
        pallets: d.plan.pallets.map((p) => ({ n: p.n, weight_kg: p.weight_kg, faces: p.faces, ...(p.kind === 'tiles' && fp ? { length_mm: fp.length_mm, width_mm: fp.width_mm } : {}) })),
      };
    });
    const deck = planDeck(row, deckDrops, loadedOf.get(row.id));
    const pallets = deck.positions.length;
    const loadedCount = deck.positions.filter((p) => p.loaded).length;
    const { geometry: _geometry, ...deckOut } = deck;
    void _geometry;
    const run: Run = {
      id: row.id,
      branch_id: row.branch_id,
      date: row.date,
      time_window: row.time_window,
      lorry: {
        id: row.lorry_id,
        registration: row.registration,
        name: row.lorry_name,
        has_crane: row.has_crane,
        crane_max_kg: row.crane_max_kg,
        payload_kg: row.payload_kg,
        pallet_slots: row.pallet_slots,
        deck_length_mm: row.deck_length_mm,
        deck_width_mm: row.deck_width_mm,
      },
      driver: row.driver_user_id ? { id: row.driver_user_id, name: row.driver_name ?? '' } : null,
      status: runStatus(row, runDrops, pallets, loadedCount),
      dispatched_at: row.sent_out_at,
      weight_kg: round1(runDrops.reduce((s, d) => s + d.weight_kg, 0)),
      pallets,
      loaded_count: loadedCount,
      drops: runDrops.map((d, i) => {
        const lines = picksOf.get(d.order_id) ?? [];
        return {
          order_id: d.order_id,
          reference: orderReference(d.order_id),
          position: i + 1,
          pallets: d.plan.pallets.length,
          weight_kg: d.weight_kg,
          status: d.status,
          contractor: { id: d.contractor_id, name: d.contractor_name },
          site_name: d.site_name,
          site_address: d.site.site_address,
          site_postcode: d.site.site_postcode,
          delivery_method: d.delivery_method,
          short: lines.some((l) => l.back_order_quantity > 0 || SHORT_LINE.has(l.status)),
        };
      }),
      deck: deckOut,
      pick_list: runDrops.map((d) => ({
        order_id: d.order_id,
        reference: orderReference(d.order_id),
        lines: (picksOf.get(d.order_id) ?? [])
          .filter((l) => l.reserved_quantity > 0)
          .map((l) => ({ sku: l.sku, description: l.description, unit: l.unit, quantity: l.reserved_quantity * l.pack_size, packs: l.pack_size > 1 ? l.reserved_quantity : null })),
      })),
    };
    const names = new Map<number, ProductNames>();
    for (const d of runDrops) {
      const m = new Map<string, { description: string; unit: string }>();
      for (const l of picksOf.get(d.order_id) ?? []) if (!m.has(l.category)) m.set(l.category, { description: l.description, unit: l.unit });
      names.set(d.order_id, m);
    }
    return { run, row, drops: runDrops, deck, names };
  });
}

/**
 * The category of the order line each of the engine's pallet items comes from; items the engine does not
 * count (valley lining, eaves ventilation, undercloak, flashing, accessories) travel under their category.
 */
const ITEM_CATEGORY: Record<string, string> = {
  underlay_rolls: 'underlay',
  battens: 'batten',
  batten_nails: 'batten_nail',
  tile_nails: 'tile_nail',
  clips: 'clip',
  ridge_tiles: 'ridge',
  hip_tiles: 'hip',
  eaves_tiles: 'eaves_tile',
  top_tiles: 'top_tile',
  tile_and_half: 'tile_and_half',
  valley_units: 'valley_trough',
  hip_irons: 'hip_iron',
  dry_verge_units: 'dry_verge',
  ridge_end_caps: 'ridge_end_cap',
};

export type ProductNames = ReadonlyMap<string, { description: string; unit: string }>;

const plural = (unit: string, n: number) => (n === 1 || /(s|m|kg)$/.test(unit) ? unit : `${unit}s`);

/**
 * What is on a pallet, in words: the order's own product names and units, never the engine's item keys.
 * A tile pallet carries its tiles and, after them, any double-lap special pieces.
 */
export function palletItems(p: { kind: string; tiles: number; items: ReadonlyArray<{ item: string; quantity: number }> }, names: ProductNames = new Map()): PalletView['items'] {
  const items = p.items.map((it) => {
    const category = ITEM_CATEGORY[it.item] ?? it.item;
    const known = names.get(category);
    const label = CATEGORY_LABELS[category as ProductCategory] ?? category.replace(/_/g, ' ');
    return { description: known?.description ?? label, quantity: it.quantity, unit: plural(known?.unit ?? 'unit', it.quantity) };
  });
  if (p.kind !== 'tiles' || (p.tiles === 0 && items.length > 0)) return items;
  const tile = names.get('tile');
  return [{ description: tile?.description ?? 'Roof tiles', quantity: p.tiles, unit: plural(tile?.unit ?? 'tile', p.tiles) }, ...items];
}
