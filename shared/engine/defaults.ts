/**
 * Every default of the roof system, in one place. Lengths in mm, weights in kg.
 *
 * The default tile is a generic single-lap concrete interlocking tile with a flat profile. Its figures
 * are invented to be typical of the kind (they are no maker's product): a real job uses the tile
 * maker's data and fixing specification, which always win over these.
 */

/** Generic flat single-lap concrete interlocking tile (invented figures). */
export const DEFAULT_TILE = {
  kind: 'single_lap' as const,
  length_mm: 420,
  width_mm: 330,
  // The side lock lets a course be closed up or spread by a few mm a tile to finish on whole tiles.
  cover_width_mm: { min: 297, nominal: 300, max: 303 },
  // Lowest band = lowest allowed pitch. 100 mm headlap gives the 320 mm gauge of a 420 mm tile.
  headlap_mm: [
    { from_pitch_deg: 22.5, min_mm: 100 },
    { from_pitch_deg: 30, min_mm: 75 },
  ],
  // Flat interlocking profiles are laid broken bond; a half is cut at the middle nail hole, and one
  // tile gives a left and a right half, so two halves per tile.
  bond: 'broken' as const,
  halves_per_tile: 2 as const,
  // About 9.7 tiles per m² at 4.4 kg is about 43 kg/m², inside the published 40–44 kg/m² for interlocking tile.
  weight_kg: 4.4,
  // About two squares (18.6 m²) a pallet.
  per_pallet: 180,
  nails_per_tile: 1,
};

/** What a tile given without these fields gets, by kind. */
export const SINGLE_LAP_TILE_DEFAULTS = {
  // Deep profiles cannot be laid broken bond; straight bond is the safe assumption when none is given.
  bond: 'straight' as const,
  halves_per_tile: 2 as const,
  nails_per_tile: 1,
};
export const DOUBLE_LAP_TILE_DEFAULTS = {
  // Plain tiles and slates are always laid broken bond; they have two nail holes.
  bond: 'broken' as const,
  halves_per_tile: 2 as const,
  nails_per_tile: 2,
};

export const SYSTEM_DEFAULTS = {
  setting_out: {
    /** Tile tails project this far past the eaves line into the gutter (at least 50 mm). */
    eaves_overhang_mm: 50,
    /** The top batten sits this far below the top edge of the face (the ridge line). */
    top_gap_mm: 40,
    /** Left out: the first batten sits at tile length − eaves overhang up the slope. */
    first_batten_mm: undefined as number | undefined,
    /** Tiles overhang each verge by this much. */
    verge_overhang_mm: { min: 30, target: 45, max: 60 },
  },
  /** Rafter or truss centres. */
  rafter_spacing_mm: 600,
  batten: {
    stock_length_mm: 4800,
    /** A batten piece spans at least this many rafters. */
    min_supports: 3,
    /** And is at least this long (1.2 m), except where a whole row is shorter. */
    min_length_mm: 1200,
    /** 38 × 25 mm softwood at about 470 kg/m³. */
    kg_per_m: 0.45,
  },
  ridge: { cover_mm: 420, weight_kg: 5 },
  /** A galvanised hip iron at the foot of each hip (invented typical weight). */
  hip: { cover_mm: 420, weight_kg: 5, iron_kg: 0.3 },
  /**
   * Verges bedded in mortar, or dry: a clipped unit a course and a cap at each ridge end that finishes
   * at a verge (invented typical weights).
   */
  verge: { kind: 'mortar' as 'mortar' | 'dry', unit_kg: 0.35, end_cap_kg: 0.4 },
  /**
   * Valleys lined (lead or a roll lining, ordered by the metre) or laid with preformed trough units,
   * each unit_length_mm long and lapping the next by lap_mm (invented typical weight).
   */
  valley: { kind: 'lined' as 'lined' | 'trough', unit_length_mm: 3000, lap_mm: 150, unit_kg: 3 },
  underlay: {
    roll_width_mm: 1000,
    roll_length_mm: 50_000,
    /** 150 mm horizontal lap suits every pitch (100 mm is allowed from 35°). */
    head_lap_mm: 150,
    roll_kg: 6,
  },
  fixing: {
    /** Every single-lap tile mechanically fixed. */
    rule: 'every_tile' as 'every_tile' | 'perimeter_and_alternate_courses',
    /** A 65 × 3.35 mm galvanised batten nail. */
    batten_nail_g: 4.5,
    /** A 38 × 3.35 mm aluminium tile nail. */
    tile_nail_g: 1.5,
    /** A stainless-steel tile clip (invented typical figure). */
    clip_g: 6,
  },
  waste_pct: { tiles: 5, battens: 10, underlay: 10, ridge_hip: 5 },
  roof_loading: { stack_size: 6, every_nth_batten: 2 },
  truck: {
    /** A three-axle rigid at 26,000 kg gross with about 11,000 kg of its own weight and crane. */
    payload_kg: 15_000,
    /** 1200 × 1000 mm pallets on a 7.3 m bed, two abreast. */
    pallet_slots: 12,
    /** An empty timber pallet. */
    pallet_tare_kg: 25,
    /** Heaviest pallet the crane and the yard handle; accessory pallets are made up to this. */
    max_pallet_kg: 1000,
  },
};

/** Above this many pallets the job should be split; the engine still gives totals but no pallet list. */
export const MAX_DELIVERY_PALLETS = 100_000;

/** One ridge's two slopes are loaded unevenly when they differ by more than this share of the heavier. */
export const RIDGE_BALANCE_TOLERANCE = 0.1;

/** At and above this pitch every tile is usually nailed whatever the fixing rule. */
export const EVERY_TILE_PITCH_DEG = 45;

/** At and above this pitch the tail of every single-lap tile is usually clipped as well as nailed. */
export const EVERY_TILE_CLIP_PITCH_DEG = 55;

/**
 * Clips, by tile kind, for each `fixing.clips` field left out. Single-lap tiles: a clip at the tail of
 * every eaves-course tile, a clip on every verge tile (whole or half) of every course, and from 55° a
 * clip at the tail of every tile. Double-lap tiles and slates are nailed, not clipped, unless told.
 */
export const SINGLE_LAP_CLIP_DEFAULTS = {
  eaves: true,
  verges: true,
  every_tile_from_pitch_deg: EVERY_TILE_CLIP_PITCH_DEG as number | null,
};
export const DOUBLE_LAP_CLIP_DEFAULTS = {
  eaves: false,
  verges: false,
  every_tile_from_pitch_deg: null as number | null,
};

/** Shown with every loading and delivery plan. */
export const SAFETY_CAUTIONS = [
  'Roof work is work at height: plan it to avoid, prevent, then mitigate falls from edges, through gaps and through fragile materials.',
  'Load the roof evenly on both slopes, top to bottom, over braced rafters or trusses; never overload one area. A structural engineer decides what the roof structure can carry.',
  'Use battens as footholds only where they are graded and fixed to suit (at least 50 × 25 mm up to 600 mm centres, 38 × 25 mm up to 450 mm).',
  'Lifting with a lorry crane needs a lift plan by a competent person; manual-handling figures are not safe limits.',
  "The tile maker's fixing specification for the site, local building regulations and licensed practice take precedence over these figures.",
];
