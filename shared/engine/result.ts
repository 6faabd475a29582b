import type { Load, Pallet } from './delivery';
import type { RidgeBalance } from './loading';
import type { SettingOutFrom } from './setting-out';

/** Figures of one face (one copy of it: multiply by quantity for the job). Lengths mm, areas m², kg. */
export interface FaceResult {
  building: string;
  face: string;
  quantity: number;
  pitch_deg: number;
  rafter_mm: number;
  slope_area_m2: number;
  headlap_mm: number;
  gauge_mm: number;
  courses: number;
  /** Tiles in the widest full course (a broken course's two halves count as one). */
  tiles_per_course: number;
  cover_width_mm: number;
  /** Overhang at the verge(s); null for a face with no verge. */
  verge_overhang_mm: number | null;
  /** Full tiles laid whole; on a double-lap face only those of the full courses between eaves and top course. */
  whole_tiles: number;
  /** Halves at the verges of broken courses (single lap); always 0 on a double-lap face. */
  half_tiles: number;
  cut_tiles: number;
  /** Full tiles taken from the pallet for this face: whole, cut, and those the halves are cut from. */
  tiles: number;
  /** Double lap: short eaves tiles (slates: eaves slates) of the under-eaves course; 0 on single lap. */
  eaves_tiles: number;
  /** Double lap: short top tiles (top slates) of the course under the ridge or top abutment; 0 on single lap. */
  top_tiles: number;
  /** Double lap: tiles-and-a-half (slate-and-a-half) keeping the bond at the verges; 0 on single lap. */
  tile_and_half: number;
  /** Slope area of the face's openings (roof windows, chimneys, dormers, hatches), one copy, m². */
  openings_area_m2: number;
  /** Name of the ridge line the top edge meets, as the schedule gives it; null when not named. */
  ridge: string | null;
  batten_m: number;
  stacks: number;
  stack_positions: number;
  load_kg: number;
  /**
   * Tile clips on this face: a tail clip on every eaves-course piece, a clip on every verge piece, and
   * from the clip pitch a tail clip on every piece (fixing.clips; defaults by tile kind).
   */
  clips: number;
  /** Chalk-line marks, mm from the reference edge. Like faces of one result may share one array: read it, never write to it. */
  setting_out_marks_mm: number[];
  /** Edge the marks are measured from. */
  setting_out_from: SettingOutFrom;
  /**
   * Stacks on each loading batten, the top one first; the loading battens are every nth batten from
   * the top (n = roof_loading.every_nth_batten), so entry i is batten row courses − i × n from the eaves.
   * Like faces of one result may share one array: read it, never write to it.
   */
  stacks_by_row: number[];
}

/** Job totals, over every face times its quantity. */
export interface Totals {
  slope_area_m2: number;
  plan_area_m2: number;
  /** Net tiles from the pallets. */
  tiles: number;
  /** Tiles to order, waste included. */
  tiles_order: number;
  half_tiles: number;
  cut_tiles: number;
  batten_m: number;
  /** Stock lengths to order, from the cutting plan, waste included. */
  batten_lengths: number;
  batten_nails: number;
  tile_nails: number;
  /** Tile clips, counted as the faces' clips (no waste: they are sold by the pack). */
  clips: number;
  ridge_m: number;
  /** Ridge tiles to order, waste included. */
  ridge_tiles: number;
  hip_m: number;
  /** Hip tiles to order, waste included. */
  hip_tiles: number;
  valley_m: number;
  /** Underlay rolls to order, waste included. */
  underlay_rolls: number;
  /** Tile pallets. */
  pallets: number;
  /** What the delivery weighs, pallets included. */
  weight_kg: number;
  /** Double lap, net: eaves tiles, top tiles and tiles-and-a-half over every face. */
  eaves_tiles: number;
  top_tiles: number;
  tile_and_half: number;
  /** The same, to order: each with the tile waste %. */
  eaves_tiles_order: number;
  top_tiles_order: number;
  tile_and_half_order: number;
  /** Slope area of every opening, m² (already left out of slope_area_m2). */
  openings_area_m2: number;
  /** Roof windows and hatches by count: each comes with its own flashing kit. */
  roof_windows: number;
  hatches: number;
  /** Flashings, metres. */
  flashings: Flashings;
  /** Raking length of every verge edge, m. */
  verge_m: number;
  /** Length of every eaves, m (eaves ventilation, comb fillers). */
  eaves_m: number;
  /** With dry verges, one unit per course on every verge edge; 0 with mortar verges. */
  dry_verge_units: number;
  /** With dry verges, a cap at each ridge end that finishes at a verge; 0 with mortar verges. */
  ridge_end_caps: number;
  /** One at the foot of each hip. */
  hip_irons: number;
  /** With trough valleys, the preformed units; 0 for lined valleys (ordered by valley_m). */
  valley_units: number;
}

export interface Flashings {
  /** Beside a wall up the slope (side abutments), and up the sides of chimneys and dormers. */
  side_abutment_m: number;
  /** Along a wall at the top of a face. */
  top_abutment_m: number;
  /** Below chimneys and dormers. */
  apron_m: number;
  /** Behind chimneys. */
  back_gutter_m: number;
}

export interface EngineWarning {
  code: string;
  building: string | null;
  face: string | null;
  message: string;
}

export interface EngineResult {
  engine_version: string;
  faces: FaceResult[];
  totals: Totals;
  pallets: Pallet[];
  loads: Load[];
  /** The faces of each ridge and the difference in their loads. */
  ridges: RidgeBalance[];
  warnings: EngineWarning[];
  cautions: string[];
}

/** A problem with the input: a schedule cell (row and column) or a system field. */
export interface InputProblem {
  /** Set when the problem is in the openings file rather than the schedule. */
  file?: 'openings';
  /** Spreadsheet row (header = 1) for a CSV; entry number (from 1) for a JSON schedule. */
  row?: number;
  column?: string;
  /** Path of a roof-system field, e.g. tile.cover_width_mm.min. */
  field?: string;
  message: string;
}
