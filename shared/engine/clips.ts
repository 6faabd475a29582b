import type { RoofSystem } from '../schemas/roof-system.schema';
import type { CoursePieces } from './bond';
import { DOUBLE_LAP_CLIP_DEFAULTS, SINGLE_LAP_CLIP_DEFAULTS } from './defaults';

/** Where tiles are clipped, every field resolved. */
export interface ClipRule {
  /** A clip at the tail of every piece of the eaves course. */
  eaves: boolean;
  /** A clip on every verge piece (whole or half) of every course. */
  verges: boolean;
  /** From this pitch in degrees a clip at the tail of every piece laid; null for never. */
  every_tile_from_pitch_deg: number | null;
}

/** The clip rule of a system: each `fixing.clips` field given, else the default for the tile's kind. */
export function clipRule(system: RoofSystem): ClipRule {
  const given = system.fixing.clips;
  const d = system.tile.kind === 'double_lap' ? DOUBLE_LAP_CLIP_DEFAULTS : SINGLE_LAP_CLIP_DEFAULTS;
  return {
    eaves: given.eaves ?? d.eaves,
    verges: given.verges ?? d.verges,
    every_tile_from_pitch_deg: given.every_tile_from_pitch_deg === undefined ? d.every_tile_from_pitch_deg : given.every_tile_from_pitch_deg,
  };
}

/** True when a face at this pitch (degrees) has every tile's tail clipped. */
export function clipsEveryTile(rule: ClipRule, pitchDeg: number): boolean {
  return rule.every_tile_from_pitch_deg !== null && pitchDeg >= rule.every_tile_from_pitch_deg - 1e-9;
}

/**
 * Clips in one course (a count). Tail clips: one on every piece laid (whole, half or cut) in the eaves
 * course when `eaves`, and in every course when `everyTile`. Verge clips: one for each verge of the
 * course (`vergeEdges`, 0 to 2) when `verges` and the course has a piece; the verge tile of the eaves
 * course gets both, a tail clip and a verge clip. Cut pieces at hips, valleys and abutments get no
 * verge clip: the tile maker's specification says how they are fixed.
 */
export function courseClips(rule: ClipRule, course: CoursePieces, courseIndex: number, vergeEdges: number, everyTile: boolean): number {
  const pieces = course.whole + course.halves + course.cut + course.tah;
  if (pieces === 0) return 0;
  const tail = everyTile || (rule.eaves && courseIndex === 0) ? pieces : 0;
  return tail + (rule.verges ? vergeEdges : 0);
}
