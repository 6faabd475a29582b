import type { Knex } from 'knex';
import type { ProductFigures } from '../server/modules/catalogue/catalogue.repository';
import type { SystemRole, SystemSettings } from '../shared/schemas/catalogue.schema';

/**
 * The demo merchants' catalogues: invented products (no maker's names or figures), each branch's
 * prices in pence and stock for several roofs, and two roof systems at every branch: a single-lap
 * concrete interlocking tile and a double-lap covering (plain tile or slate). Technical figures are
 * typical of their kind and meant for the demo only; a real job follows the tile maker's data.
 */

type DemoProduct = ProductFigures;

interface DemoSystem {
  name: string;
  description: string;
  settings: SystemSettings;
  components: Partial<Record<SystemRole, string>>;
}

export interface DemoMerchant {
  organisation: string;
  products: DemoProduct[];
  /** Pence per pack at the first branch; other branches vary by their factor. */
  prices: Record<string, number>;
  /** Packs on hand at the first branch, and the level at which the desk reorders. */
  stock: Record<string, [onHand: number, reorder: number]>;
  branches: { name: string; priceFactor: number; stockFactor: number }[];
  systems: DemoSystem[];
}

const interlockingTile = (sku: string, name: string, f: { length: number; width: number; cover: number; bands: [number, number][]; kg: number; perPallet: number }): DemoProduct => ({
  sku,
  name,
  category: 'tile',
  unit: 'tile',
  pack_size: 1,
  pack_weight_kg: f.kg,
  technical: {
    kind: 'single_lap',
    length_mm: f.length,
    width_mm: f.width,
    // About 3 mm of play at the side lock each way (common practice for single-lap tiles).
    cover_width_mm: { min: f.cover - 3, nominal: f.cover, max: f.cover + 3 },
    headlap_mm: f.bands.map(([from, min]) => ({ from_pitch_deg: from, min_mm: min })),
    bond: 'broken',
    halves_per_tile: 2,
    weight_kg: f.kg,
    per_pallet: f.perPallet,
    nails_per_tile: 1,
  },
});

const ridge = (sku: string, name: string, category: 'ridge' | 'hip', cover: number, kg: number): DemoProduct => ({
  sku,
  name,
  category,
  unit: 'piece',
  pack_size: 1,
  pack_weight_kg: kg,
  technical: { cover_mm: cover, weight_kg: kg },
});

const batten = (sku: string, name: string, width: number, depth: number, kgPerM: number): DemoProduct => ({
  sku,
  name,
  category: 'batten',
  unit: 'length',
  pack_size: 1,
  pack_weight_kg: Math.round(kgPerM * 4.8 * 100) / 100,
  technical: { stock_length_mm: 4800, width_mm: width, depth_mm: depth, kg_per_m: kgPerM },
});

const nails = (sku: string, name: string, category: 'batten_nail' | 'tile_nail', perBox: number, f: { length: number; diameter: number; g: number }): DemoProduct => ({
  sku,
  name,
  category,
  unit: 'nail',
  pack_size: perBox,
  pack_weight_kg: Math.round(perBox * f.g) / 1000,
  technical: { length_mm: f.length, diameter_mm: f.diameter, nail_g: f.g },
});

const clips = (sku: string, name: string, perBag: number, g: number): DemoProduct => ({
  sku,
  name,
  category: 'clip',
  unit: 'clip',
  pack_size: perBag,
  pack_weight_kg: Math.round(perBag * g) / 1000,
  technical: { clip_g: g },
});

const underlay = (sku: string, name: string): DemoProduct => ({
  sku,
  name,
  category: 'underlay',
  unit: 'roll',
  pack_size: 1,
  pack_weight_kg: 6.5,
  technical: { roll_width_mm: 1000, roll_length_mm: 50_000, roll_kg: 6.5 },
});

const valley = (sku: string, name: string, metres: number, kg: number): DemoProduct => ({
  sku,
  name,
  category: 'valley',
  unit: 'm',
  pack_size: metres,
  pack_weight_kg: kg,
  technical: { weight_kg: kg },
});

/** A piece counted by the engine whose weight it needs: a double-lap special tile or slate, or a fitting. */
const piece = (sku: string, name: string, category: 'eaves_tile' | 'top_tile' | 'tile_and_half' | 'dry_verge' | 'ridge_end_cap' | 'hip_iron', unit: string, kg: number): DemoProduct => ({
  sku,
  name,
  category,
  unit,
  pack_size: 1,
  pack_weight_kg: kg,
  technical: { weight_kg: kg },
});

/** Sold by the metre in lengths or rolls: the unit is the metre, the pack the metres in one length or roll. */
const byTheMetre = (sku: string, name: string, category: 'eaves_vent' | 'verge_undercloak' | 'flashing', metres: number, kg: number): DemoProduct => ({
  sku,
  name,
  category,
  unit: 'm',
  pack_size: metres,
  pack_weight_kg: kg,
  technical: { weight_kg: kg },
});

const trough = (sku: string, name: string, unitLength: number, lap: number, kg: number): DemoProduct => ({
  sku,
  name,
  category: 'valley_trough',
  unit: 'piece',
  pack_size: 1,
  pack_weight_kg: kg,
  technical: { unit_length_mm: unitLength, lap_mm: lap, weight_kg: kg },
});

const everyTile: SystemSettings = { rafter_spacing_mm: 600, fixing: { rule: 'every_tile' }, underlay: { head_lap_mm: 150 } };

export const DEMO_CATALOGUES: DemoMerchant[] = [
  {
    organisation: 'Tollerbeck Roofing Supplies',
    products: [
      interlockingTile('TRS-FL420-SG', 'Flatlock 420 concrete interlocking tile, slate grey', {
        length: 420,
        width: 330,
        cover: 300,
        bands: [
          [22.5, 100],
          [30, 75],
        ],
        kg: 4.4,
        perPallet: 180,
      }),
      {
        sku: 'TRS-KP265-BR',
        name: 'Kilnworth clay plain tile 265 × 165, brindle',
        category: 'tile',
        unit: 'tile',
        pack_size: 1,
        pack_weight_kg: 1.15,
        technical: {
          kind: 'double_lap',
          length_mm: 265,
          width_mm: 165,
          // 65 mm headlap from 35° (NHBC 7.2.19 table for plain tiles).
          headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }],
          bond: 'broken',
          halves_per_tile: 2,
          weight_kg: 1.15,
          per_pallet: 800,
          nails_per_tile: 2,
        },
      },
      ridge('TRS-RHR-SG', 'Half-round concrete ridge, slate grey', 'ridge', 420, 4.8),
      ridge('TRS-HTR-SG', 'Third-round concrete hip, slate grey', 'hip', 420, 4.6),
      ridge('TRS-RCL-BR', 'Clay half-round ridge, brindle', 'ridge', 430, 5.2),
      ridge('TRS-HCL-BR', 'Clay third-round hip, brindle', 'hip', 430, 4.9),
      batten('TRS-BAT-3825', 'Treated softwood batten 38 × 25 mm, 4.8 m', 38, 25, 0.45),
      nails('TRS-NB65-1K', 'Galvanised batten nails 65 × 3.35 mm, box of 1000', 'batten_nail', 1000, { length: 65, diameter: 3.35, g: 4.5 }),
      nails('TRS-NT38-1K', 'Aluminium tile nails 38 × 3.35 mm, box of 1000', 'tile_nail', 1000, { length: 38, diameter: 3.35, g: 1.5 }),
      clips('TRS-CLP-FL', 'Tail clips for Flatlock 420, bag of 100', 100, 6),
      underlay('TRS-UVP-50', 'Vapour-permeable underlay 1 m × 50 m'),
      valley('TRS-VAL-3M', 'Moulded valley trough, 3 m length', 3, 4.2),
      // Plain tile specials: a short eaves and top tile, and a tile-and-a-half for the verges (weights typical, for the demo only).
      piece('TRS-KPE-BR', 'Kilnworth clay plain eaves tile 190 × 165, brindle', 'eaves_tile', 'tile', 0.85),
      piece('TRS-KPT-BR', 'Kilnworth clay plain top tile 190 × 165, brindle', 'top_tile', 'tile', 0.85),
      piece('TRS-KPH-BR', 'Kilnworth clay plain tile-and-a-half 265 × 248, brindle', 'tile_and_half', 'tile', 1.7),
      piece('TRS-HIR-GV', 'Galvanised hip iron', 'hip_iron', 'piece', 0.3),
      byTheMetre('TRS-EVC-5M', 'Eaves vent strip with comb filler, 5 m roll', 'eaves_vent', 5, 1.4),
      byTheMetre('TRS-VUC-2M', 'Fibre-cement verge undercloak strip 150 mm, 2 m length', 'verge_undercloak', 2, 2.6),
      byTheMetre('TRS-FLR-6M', 'Lead-free flashing roll 300 mm × 6 m', 'flashing', 6, 4.8),
    ],
    prices: {
      'TRS-FL420-SG': 128,
      'TRS-KP265-BR': 74,
      'TRS-RHR-SG': 650,
      'TRS-HTR-SG': 690,
      'TRS-RCL-BR': 1150,
      'TRS-HCL-BR': 1120,
      'TRS-BAT-3825': 440,
      'TRS-NB65-1K': 1850,
      'TRS-NT38-1K': 2450,
      'TRS-CLP-FL': 1650,
      'TRS-UVP-50': 6400,
      'TRS-VAL-3M': 2890,
      'TRS-KPE-BR': 82,
      'TRS-KPT-BR': 82,
      'TRS-KPH-BR': 165,
      'TRS-HIR-GV': 295,
      'TRS-EVC-5M': 1240,
      'TRS-VUC-2M': 385,
      'TRS-FLR-6M': 4650,
    },
    stock: {
      // Enough for the example development (twenty houses) and a few single roofs besides.
      'TRS-FL420-SG': [60000, 12000],
      'TRS-KP265-BR': [40000, 8000],
      'TRS-RHR-SG': [900, 150],
      'TRS-HTR-SG': [2000, 300],
      'TRS-RCL-BR': [400, 80],
      'TRS-HCL-BR': [600, 100],
      'TRS-BAT-3825': [5000, 800],
      'TRS-NB65-1K': [80, 15],
      'TRS-NT38-1K': [120, 20],
      'TRS-CLP-FL': [200, 40],
      'TRS-UVP-50': [250, 40],
      'TRS-VAL-3M': [60, 10],
      'TRS-KPE-BR': [4000, 800],
      'TRS-KPT-BR': [4000, 800],
      'TRS-KPH-BR': [3000, 600],
      'TRS-HIR-GV': [300, 50],
      'TRS-EVC-5M': [400, 60],
      'TRS-VUC-2M': [900, 150],
      'TRS-FLR-6M': [120, 20],
    },
    branches: [
      { name: 'Tollerbeck Yard', priceFactor: 1, stockFactor: 1 },
      { name: 'Cindermoor Depot', priceFactor: 1.04, stockFactor: 0.6 },
    ],
    systems: [
      {
        name: 'Flatlock 420 interlocking tile roof',
        description: 'Single-lap flat concrete interlocking tile, broken bond, with half-round ridge, third-round hip and 38 × 25 battens; mortar verges on an undercloak strip.',
        settings: everyTile,
        components: {
          tile: 'TRS-FL420-SG',
          ridge: 'TRS-RHR-SG',
          hip: 'TRS-HTR-SG',
          batten: 'TRS-BAT-3825',
          batten_nail: 'TRS-NB65-1K',
          tile_nail: 'TRS-NT38-1K',
          clip: 'TRS-CLP-FL',
          underlay: 'TRS-UVP-50',
          valley: 'TRS-VAL-3M',
          hip_iron: 'TRS-HIR-GV',
          eaves_vent: 'TRS-EVC-5M',
          verge_undercloak: 'TRS-VUC-2M',
          flashing: 'TRS-FLR-6M',
        },
      },
      {
        name: 'Kilnworth clay plain tile roof',
        description: 'Double-lap clay plain tile at 100 mm gauge (65 mm headlap), with clay ridge and hip, twice-nailed.',
        settings: { ...everyTile, waste_pct: { tiles: 7 } },
        components: {
          tile: 'TRS-KP265-BR',
          eaves_tile: 'TRS-KPE-BR',
          top_tile: 'TRS-KPT-BR',
          tile_and_half: 'TRS-KPH-BR',
          ridge: 'TRS-RCL-BR',
          hip: 'TRS-HCL-BR',
          batten: 'TRS-BAT-3825',
          batten_nail: 'TRS-NB65-1K',
          tile_nail: 'TRS-NT38-1K',
          underlay: 'TRS-UVP-50',
          valley: 'TRS-VAL-3M',
          hip_iron: 'TRS-HIR-GV',
          eaves_vent: 'TRS-EVC-5M',
          verge_undercloak: 'TRS-VUC-2M',
          flashing: 'TRS-FLR-6M',
        },
      },
    ],
  },
  {
    organisation: 'Caddonmere Tile & Timber',
    products: [
      interlockingTile('CTT-WL380-RU', 'Wharf-Lock 380 concrete interlocking tile, russet', {
        length: 380,
        width: 230,
        cover: 200,
        bands: [
          [25, 90],
          [30, 75],
        ],
        kg: 2.6,
        perPallet: 350,
      }),
      {
        sku: 'CTT-SL5025-BG',
        name: 'Pellingsby blue-grey slate 500 × 250 mm',
        category: 'tile',
        unit: 'slate',
        pack_size: 1,
        pack_weight_kg: 2.1,
        technical: {
          kind: 'double_lap',
          length_mm: 500,
          width_mm: 250,
          // Headlap grows as the pitch falls (common practice; figures from memory, not a maker's table).
          headlap_mm: [
            { from_pitch_deg: 22.5, min_mm: 100 },
            { from_pitch_deg: 27.5, min_mm: 90 },
            { from_pitch_deg: 35, min_mm: 75 },
          ],
          bond: 'broken',
          halves_per_tile: 2,
          weight_kg: 2.1,
          per_pallet: 400,
          nails_per_tile: 2,
        },
      },
      ridge('CTT-RSR-RU', 'Segmental concrete ridge, russet', 'ridge', 410, 4.5),
      ridge('CTT-HSR-RU', 'Segmental concrete hip, russet', 'hip', 410, 4.5),
      ridge('CTT-RAN-BG', 'Blue clay angle ridge 450 mm', 'ridge', 420, 4.4),
      batten('CTT-BAT-3825', 'Graded treated batten 38 × 25 mm, 4.8 m', 38, 25, 0.45),
      // Natural slate on 600 mm centres needs 50 × 25 battens (BS 5534 Table 3 as reproduced by the NFRC).
      batten('CTT-BAT-5025', 'Graded treated batten 50 × 25 mm, 4.8 m', 50, 25, 0.59),
      nails('CTT-NB65-1K', 'Galvanised batten nails 65 × 3.35 mm, box of 1000', 'batten_nail', 1000, { length: 65, diameter: 3.35, g: 4.5 }),
      nails('CTT-NT38-1K', 'Aluminium tile nails 38 × 3.35 mm, box of 1000', 'tile_nail', 1000, { length: 38, diameter: 3.35, g: 1.5 }),
      nails('CTT-NS30-500', 'Copper slate nails 30 × 3.35 mm, box of 500', 'tile_nail', 500, { length: 30, diameter: 3.35, g: 2.4 }),
      clips('CTT-CLP-WL', 'Tail clips for Wharf-Lock 380, bag of 100', 100, 5),
      underlay('CTT-UVP-50', 'Breathable roof underlay 1 m × 50 m'),
      valley('CTT-VAL-3M', 'Lead-free valley lining, 3 m length', 3, 5.1),
      // Dry verge units and end caps to match the Wharf-Lock tile, and a preformed valley trough (weights typical, for the demo only).
      piece('CTT-DVU-RU', 'Dry verge unit for Wharf-Lock 380, russet', 'dry_verge', 'piece', 0.35),
      piece('CTT-REC-RU', 'Segmental ridge end cap, russet', 'ridge_end_cap', 'piece', 0.4),
      trough('CTT-VTU-3M', 'Moulded valley trough unit, 3 m', 3000, 150, 3.2),
      // Slate specials: a short eaves and top slate, and a slate-and-a-half for the verges.
      piece('CTT-SLE-BG', 'Pellingsby blue-grey eaves slate 300 × 250 mm', 'eaves_tile', 'slate', 1.3),
      piece('CTT-SLT-BG', 'Pellingsby blue-grey top slate 350 × 250 mm', 'top_tile', 'slate', 1.5),
      piece('CTT-SLH-BG', 'Pellingsby blue-grey slate-and-a-half 500 × 375 mm', 'tile_and_half', 'slate', 3.2),
      piece('CTT-HIR-GV', 'Galvanised hip iron', 'hip_iron', 'piece', 0.3),
      byTheMetre('CTT-EVG-1M', 'Eaves ventilation grille with bird comb, 1 m length', 'eaves_vent', 1, 0.3),
      byTheMetre('CTT-VUC-2M', 'Verge undercloak strip 150 mm, 2 m length', 'verge_undercloak', 2, 2.4),
      byTheMetre('CTT-FLR-6M', 'Flexible flashing roll 300 mm × 6 m', 'flashing', 6, 4.5),
    ],
    prices: {
      'CTT-WL380-RU': 89,
      'CTT-SL5025-BG': 215,
      'CTT-RSR-RU': 615,
      'CTT-HSR-RU': 640,
      'CTT-RAN-BG': 980,
      'CTT-BAT-3825': 455,
      'CTT-BAT-5025': 585,
      'CTT-NB65-1K': 1795,
      'CTT-NT38-1K': 2395,
      'CTT-NS30-500': 3450,
      'CTT-CLP-WL': 1590,
      'CTT-UVP-50': 6150,
      'CTT-VAL-3M': 3190,
      'CTT-DVU-RU': 420,
      'CTT-REC-RU': 690,
      'CTT-VTU-3M': 2650,
      'CTT-SLE-BG': 175,
      'CTT-SLT-BG': 185,
      'CTT-SLH-BG': 340,
      'CTT-HIR-GV': 310,
      'CTT-EVG-1M': 295,
      'CTT-VUC-2M': 375,
      'CTT-FLR-6M': 4490,
    },
    stock: {
      'CTT-WL380-RU': [90000, 15000],
      'CTT-SL5025-BG': [60000, 10000],
      'CTT-RSR-RU': [900, 150],
      'CTT-HSR-RU': [2000, 300],
      'CTT-RAN-BG': [900, 150],
      'CTT-BAT-3825': [5000, 800],
      'CTT-BAT-5025': [9000, 1500],
      'CTT-NB65-1K': [80, 15],
      'CTT-NT38-1K': [120, 20],
      'CTT-NS30-500': [300, 50],
      'CTT-CLP-WL': [300, 50],
      'CTT-UVP-50': [250, 40],
      'CTT-VAL-3M': [50, 8],
      'CTT-DVU-RU': [3000, 500],
      'CTT-REC-RU': [200, 40],
      'CTT-VTU-3M': [80, 12],
      'CTT-SLE-BG': [3000, 500],
      'CTT-SLT-BG': [3000, 500],
      'CTT-SLH-BG': [2000, 300],
      'CTT-HIR-GV': [300, 50],
      'CTT-EVG-1M': [1500, 200],
      'CTT-VUC-2M': [900, 150],
      'CTT-FLR-6M': [120, 20],
    },
    branches: [
      { name: 'Caddonmere Wharf', priceFactor: 1, stockFactor: 1 },
      { name: 'Pellingsby Yard', priceFactor: 0.97, stockFactor: 0.7 },
    ],
    systems: [
      {
        name: 'Wharf-Lock 380 interlocking tile roof',
        description: 'Single-lap concrete interlocking tile with segmental ridge and hip on 38 × 25 battens, dry verges and moulded valley troughs.',
        settings: everyTile,
        components: {
          tile: 'CTT-WL380-RU',
          ridge: 'CTT-RSR-RU',
          hip: 'CTT-HSR-RU',
          batten: 'CTT-BAT-3825',
          batten_nail: 'CTT-NB65-1K',
          tile_nail: 'CTT-NT38-1K',
          clip: 'CTT-CLP-WL',
          underlay: 'CTT-UVP-50',
          // Dry verges and preformed troughs: the system's verge units, end caps and trough units are counted as pieces.
          valley_trough: 'CTT-VTU-3M',
          dry_verge: 'CTT-DVU-RU',
          ridge_end_cap: 'CTT-REC-RU',
          hip_iron: 'CTT-HIR-GV',
          eaves_vent: 'CTT-EVG-1M',
          flashing: 'CTT-FLR-6M',
        },
      },
      {
        name: 'Pellingsby slate roof 500 × 250',
        description: 'Double-lap natural slate, twice-nailed with copper nails, on 50 × 25 battens, with blue clay angle ridge.',
        settings: { ...everyTile, waste_pct: { tiles: 8 } },
        components: {
          tile: 'CTT-SL5025-BG',
          eaves_tile: 'CTT-SLE-BG',
          top_tile: 'CTT-SLT-BG',
          tile_and_half: 'CTT-SLH-BG',
          ridge: 'CTT-RAN-BG',
          batten: 'CTT-BAT-5025',
          batten_nail: 'CTT-NB65-1K',
          tile_nail: 'CTT-NS30-500',
          underlay: 'CTT-UVP-50',
          valley: 'CTT-VAL-3M',
          hip_iron: 'CTT-HIR-GV',
          eaves_vent: 'CTT-EVG-1M',
          verge_undercloak: 'CTT-VUC-2M',
          flashing: 'CTT-FLR-6M',
        },
      },
    ],
  },
];

const idOf = (row: unknown) => (typeof row === 'object' && row !== null ? (row as { id: number }).id : (row as number));

type Branch = { id: number; priceFactor: number; stockFactor: number };
type Catalogue = Pick<DemoMerchant, 'products' | 'prices' | 'stock' | 'systems'>;

async function insertProduct(trx: Knex, organisationId: number, p: DemoProduct, now: string): Promise<number> {
  const [row] = await trx('products')
    .insert({ organisation_id: organisationId, ...p, technical: JSON.stringify(p.technical), created_at: now, updated_at: now })
    .returning('id');
  return idOf(row);
}

async function sellAt(trx: Knex, b: Branch, merchant: Catalogue, p: DemoProduct, productId: number, now: string): Promise<void> {
  const [onHand, reorder] = merchant.stock[p.sku];
  await trx('branch_products').insert({
    branch_id: b.id,
    product_id: productId,
    pack_price: Math.round(merchant.prices[p.sku] * b.priceFactor),
    on_hand: Math.round(onHand * b.stockFactor),
    reserved: 0,
    reorder_level: Math.round(reorder * b.stockFactor),
    updated_at: now,
  });
}

/**
 * Puts one merchant's catalogue into the database: its products, each branch's prices and stock, and
 * every system at every branch given. Returns the ids made, by SKU and by branch.
 */
export async function installCatalogue(
  knex: Knex,
  organisationId: number,
  branches: Branch[],
  merchant: Catalogue,
): Promise<{ productIds: Map<string, number>; systemIds: { branchId: number; name: string; id: number }[] }> {
  const now = new Date().toISOString();
  return knex.transaction(async (trx) => {
    const productIds = new Map<string, number>();
    const systemIds: { branchId: number; name: string; id: number }[] = [];
    for (const p of merchant.products) productIds.set(p.sku, await insertProduct(trx, organisationId, p, now));
    for (const b of branches) {
      for (const p of merchant.products) await sellAt(trx, b, merchant, p, productIds.get(p.sku)!, now);
      for (const s of merchant.systems) {
        const [sys] = await trx('roof_systems')
          .insert({
            organisation_id: organisationId,
            branch_id: b.id,
            name: s.name,
            description: s.description,
            settings: JSON.stringify(s.settings),
            created_at: now,
            updated_at: now,
          })
          .returning('id');
        systemIds.push({ branchId: b.id, name: s.name, id: idOf(sys) });
        for (const [role, sku] of Object.entries(s.components)) {
          await trx('roof_system_components').insert({ roof_system_id: idOf(sys), role, product_id: productIds.get(sku as string) });
        }
      }
    }
    return { productIds, systemIds };
  });
}

/**
 * Brings a catalogue seeded from an earlier demo up to this one without touching what it has: the demo
 * products it lacks (by SKU), sold at its demo branches, and each demo system's parts for roles it has
 * no product for. Returns how many products and parts were added.
 */
export async function addMissingParts(knex: Knex, organisationId: number, branches: Branch[], merchant: Catalogue): Promise<{ products: number; parts: number }> {
  const now = new Date().toISOString();
  return knex.transaction(async (trx) => {
    const rows = (await trx('products').where({ organisation_id: organisationId }).select('id', 'sku')) as { id: number; sku: string }[];
    const productIds = new Map(rows.map((r) => [r.sku, r.id]));
    let products = 0;
    let parts = 0;
    for (const p of merchant.products) {
      if (productIds.has(p.sku)) continue;
      const id = await insertProduct(trx, organisationId, p, now);
      productIds.set(p.sku, id);
      for (const b of branches) await sellAt(trx, b, merchant, p, id, now);
      products++;
    }
    for (const b of branches) {
      for (const s of merchant.systems) {
        const sys = (await trx('roof_systems').where({ organisation_id: organisationId, branch_id: b.id, name: s.name }).whereNull('archived_at').first('id')) as { id: number } | undefined;
        if (!sys) continue;
        const has = new Set(((await trx('roof_system_components').where({ roof_system_id: sys.id }).select('role')) as { role: string }[]).map((r) => r.role));
        for (const [role, sku] of Object.entries(s.components)) {
          if (has.has(role)) continue;
          await trx('roof_system_components').insert({ roof_system_id: sys.id, role, product_id: productIds.get(sku as string) });
          parts++;
        }
      }
    }
    return { products, parts };
  });
}

/**
 * Safe to run again: a merchant seeded before keeps everything it has and gains only the demo products
 * and system parts it lacks (a demo database from before the fittings gets them).
 */
export async function seed(knex: Knex): Promise<void> {
  for (const merchant of DEMO_CATALOGUES) {
    const org = await knex('organisations').where({ name: merchant.organisation, kind: 'merchant' }).first();
    if (!org) continue;
    const branches: Branch[] = [];
    for (const b of merchant.branches) {
      const branch = await knex('branches').where({ organisation_id: org.id, name: b.name }).first();
      if (branch) branches.push({ id: branch.id, priceFactor: b.priceFactor, stockFactor: b.stockFactor });
    }
    if (await knex('products').where({ organisation_id: org.id, sku: merchant.products[0].sku }).first()) {
      await addMissingParts(knex, org.id, branches, merchant);
      continue;
    }
    await installCatalogue(knex, org.id, branches, merchant);
  }
}
