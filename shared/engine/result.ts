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
  whole_tiles: number;
  half_tiles: number;
  cut_tiles: number;
  /** Tiles taken from the pallet for this face: whole, cut, and those the halves are cut from. */
  tiles: number;
  batten_m: number;
  stacks: number;
  stack_positions: number;
  load_kg: number;
  /**
   * Tile clips on this face: a tail clip on every eaves-course piece, a clip on every verge piece, and
   * from the clip pitch a tail clip on every piece (fixing.clips; defaults by tile kind).
   */
  clips: number;
  setting_out_marks_mm: number[];
  /** Edge the marks are measured from. */
  setting_out_from: SettingOutFrom;
  /**
   * Stacks on each loading batten, the top one first; the loading battens are every nth batten from
   * the top (n = roof_loading.every_nth_batten), so entry i is batten row courses − i × n from the eaves.
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
  /** The two slopes of each ridge and the difference in their loads. */
  ridges: RidgeBalance[];
  warnings: EngineWarning[];
  cautions: string[];
}

/** A problem with the input: a schedule cell (row and column) or a system field. */
export interface InputProblem {
  /** Spreadsheet row (header = 1) for a CSV; entry number (from 1) for a JSON schedule. */
  row?: number;
  column?: string;
  /** Path of a roof-system field, e.g. tile.cover_width_mm.min. */
  field?: string;
  message: string;
}
