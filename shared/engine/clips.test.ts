import { describe, expect, it } from 'vitest';
import { roofSystemSchema, type RoofSystemInput } from '../schemas/roof-system.schema';
import type { EdgeKind, Face } from '../schemas/schedule.schema';
import { clipRule, clipsEveryTile, courseClips } from './clips';
import { DOUBLE_LAP_CLIP_DEFAULTS, EVERY_TILE_CLIP_PITCH_DEG, SINGLE_LAP_CLIP_DEFAULTS } from './defaults';
import { estimate } from './estimate';
import { parseRoofSystem } from './roof-system';

const system = (input: RoofSystemInput = {}) => roofSystemSchema.parse(input);

const PLAIN_TILE = {
  kind: 'double_lap' as const,
  length_mm: 265,
  width_mm: 165,
  headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }],
  weight_kg: 1.1,
  per_pallet: 1000,
};

/** 8940 mm between verges takes 30 default tiles at nominal cover; 2970 mm up the slope gives 9 courses. */
function face(pitch: number, left: EdgeKind = 'verge', right: EdgeKind = 'verge', top_mm = 8_940, quantity = 1): Face {
  return {
    building: '1',
    face: 'F',
    quantity,
    pitch_deg: pitch,
    rafter_mm: 370 + 8 * 320 + 40,
    run_mm: 1,
    eaves_mm: 8_940,
    top_mm,
    left,
    right,
    top: 'ridge',
  };
}

describe('tile clips', () => {
  it('clips every eaves-course tile and every verge tile of a single-lap roof (common practice)', () => {
    expect(clipRule(system())).toEqual({ eaves: true, verges: true, every_tile_from_pitch_deg: 55 });
    const r = estimate([face(35)], system());
    const f = r.faces[0];
    expect(f.courses).toBe(9);
    expect(f.tiles_per_course).toBe(30);
    // 30 tail clips on the eaves course, and a clip at each verge of each of the 9 courses (halves too).
    expect(f.clips).toBe(30 + 9 * 2);
    expect(r.totals.clips).toBe(48);
  });

  it('clips the tail of every tile at 55° and above, on top of the nails (BS 5534:2014 as summarised by a roofing consultant, secondary)', () => {
    expect(EVERY_TILE_CLIP_PITCH_DEG).toBe(55);
    const steep = estimate([face(55)], system()).faces[0];
    const pieces = steep.whole_tiles + steep.half_tiles + steep.cut_tiles;
    expect(pieces).toBe(5 * 30 + 4 * 31); // straight courses of 30, broken ones of 29 and two halves
    expect(steep.clips).toBe(pieces + 9 * 2);
    expect(estimate([face(54.9)], system()).faces[0].clips).toBe(30 + 9 * 2);
  });

  it('gives every verge tile two fixings, a nail and a clip (BS 5534:2014 perimeter tiles, as summarised by a roofing consultant, secondary)', () => {
    const r = estimate([face(35)], system({ fixing: { rule: 'every_tile', clips: { eaves: false } } }));
    const f = r.faces[0];
    // Only the verge clips are left: one per verge piece, and each of those pieces is nailed too.
    expect(f.clips).toBe(2 * f.courses);
    expect(r.totals.tile_nails).toBe(f.whole_tiles + f.half_tiles + f.cut_tiles);
  });

  it('puts no verge clip at a hip: a verge-to-hip face has one verge clip a course, a hip end none', () => {
    const oneVerge = estimate([face(35, 'verge', 'hip', 4_940)], system()).faces[0];
    const eavesPieces = 30; // 8940 mm from the verge to the hip corner: 29 whole tiles and the cut at the hip
    expect(oneVerge.clips).toBe(eavesPieces + oneVerge.courses);
    const hipEnd = estimate([face(35, 'hip', 'hip', 0)], system()).faces[0];
    expect(hipEnd.clips).toBe(30); // the eaves course only: 28 whole and a cut at each hip
  });

  it('does not clip double-lap tiles or slates unless told to', () => {
    expect(clipRule(system({ tile: PLAIN_TILE }))).toEqual(DOUBLE_LAP_CLIP_DEFAULTS);
    const plain = estimate([face(40)], system({ tile: PLAIN_TILE })).faces[0];
    expect(plain.clips).toBe(0);
    const told = estimate([face(40)], system({ tile: PLAIN_TILE, fixing: { clips: { verges: true } } })).faces[0];
    expect(told.clips).toBe(2 * told.courses);
  });

  it('follows the clip rule as set, field by field, and warns when steep tiles are not all clipped', () => {
    expect(estimate([face(35)], system({ fixing: { clips: { verges: false } } })).faces[0].clips).toBe(30);
    expect(estimate([face(35)], system({ fixing: { clips: { eaves: false, verges: false } } })).faces[0].clips).toBe(0);
    const from40 = estimate([face(45)], system({ fixing: { clips: { every_tile_from_pitch_deg: 40 } } })).faces[0];
    expect(from40.clips).toBe(from40.whole_tiles + from40.half_tiles + from40.cut_tiles + 18);
    const never = estimate([face(60)], system({ fixing: { clips: { every_tile_from_pitch_deg: null } } }));
    expect(never.faces[0].clips).toBe(48);
    expect(never.warnings.map((w) => w.code)).toContain('clip_rule_pitch');
    expect(estimate([face(60)], system()).warnings.map((w) => w.code)).not.toContain('clip_rule_pitch');
  });

  it('multiplies by quantity and sends the clips with the first-off accessories, by weight', () => {
    const r = estimate([face(35, 'verge', 'verge', 8_940, 40)], system({ fixing: { clip_g: 10 } }));
    expect(r.totals.clips).toBe(40 * 48);
    const clips = r.pallets.flatMap((p) => p.items).filter((i) => i.item === 'clips');
    expect(clips.reduce((n, i) => n + i.quantity, 0)).toBe(1_920);
    expect(clips.reduce((kg, i) => kg + i.weight_kg, 0)).toBeCloseTo(19.2, 6);
    const clipPallet = r.pallets.find((p) => p.items.some((i) => i.item === 'clips'));
    const firstTiles = r.pallets.find((p) => p.kind === 'tiles');
    expect(clipPallet && firstTiles && clipPallet.n < firstTiles.n).toBe(true);
  });

  it('counts a course’s clips: tail clips on its pieces, a clip for each verge', () => {
    const course = { whole: 10, halves: 2, cut: 1, perimeter: 3, tah: 0 };
    const rule = SINGLE_LAP_CLIP_DEFAULTS;
    expect(courseClips(rule, course, 0, 2, false)).toBe(13 + 2);
    expect(courseClips(rule, course, 1, 2, false)).toBe(2);
    expect(courseClips(rule, course, 1, 1, true)).toBe(13 + 1);
    expect(courseClips(rule, { whole: 0, halves: 0, cut: 0, perimeter: 0, tah: 0 }, 0, 2, true)).toBe(0);
    expect(clipsEveryTile(rule, 55)).toBe(true);
    expect(clipsEveryTile(rule, 54.99)).toBe(false);
    expect(clipsEveryTile({ ...rule, every_tile_from_pitch_deg: null }, 89)).toBe(false);
  });

  it('names the field of a bad clip setting', () => {
    const r = parseRoofSystem({ fixing: { clips: { eaves: 'yes', every_tile_from_pitch_deg: 0, tails: true }, clip_g: -1 } });
    if (r.ok) throw new Error('accepted');
    expect(r.errors).toEqual(
      expect.arrayContaining([
        { field: 'fixing.clips.eaves', message: 'must be true or false' },
        { field: 'fixing.clips.every_tile_from_pitch_deg', message: 'must be a pitch in degrees above 0 and at most 90, or null for never' },
        { field: 'fixing.clips.tails', message: 'is not a field of the roof system' },
        { field: 'fixing.clip_g', message: 'must be 0 or more' },
      ]),
    );
  });
});
