import { describe, expect, it } from 'vitest';
import { roofSystemSchema } from '../schemas/roof-system.schema';
import { isBrokenCourse, rakeToRakeCourse, tilesForHalves, vergeCourse, vergeToRakeCourse } from './bond';
import { DEFAULT_TILE } from './defaults';
import { estimate } from './estimate';

const gable = (eaves: number) => [
  {
    building: '1',
    face: 'Front',
    quantity: 1,
    pitch_deg: 35,
    rafter_mm: 370 + 8 * 320 + 40,
    run_mm: 1,
    eaves_mm: eaves,
    top_mm: eaves,
    left: 'verge' as const,
    right: 'verge' as const,
    top: 'ridge' as const,
  },
];

describe('bond', () => {
  it('breaks every second course, starting with the second from the eaves (common practice)', () => {
    expect([0, 1, 2, 3, 4].map((i) => isBrokenCourse('broken', i))).toEqual([false, true, false, true, false]);
    expect([0, 1, 2, 3].map((i) => isBrokenCourse('straight', i))).toEqual([false, false, false, false]);
  });

  it('gives a broken course n − 1 whole tiles and a half at each verge (common practice)', () => {
    const fit = { tiles: 30, cover_mm: 300, overhang_mm: 45, fits: true };
    expect(vergeCourse(fit, false)).toEqual({ whole: 30, halves: 0, cut: 0, perimeter: 2, tah: 0 });
    expect(vergeCourse(fit, true)).toEqual({ whole: 29, halves: 2, cut: 0, perimeter: 2, tah: 0 });
    expect(vergeCourse({ ...fit, fits: false }, true)).toEqual({ whole: 28, halves: 2, cut: 1, perimeter: 3, tah: 0 });
  });

  it('cuts half tiles from whole tiles at the middle nail hole, two halves from one tile (common practice)', () => {
    expect(DEFAULT_TILE.halves_per_tile).toBe(2);
    expect(tilesForHalves(2, 2)).toBe(1);
    expect(tilesForHalves(3, 2)).toBe(2);
    expect(tilesForHalves(3, 1)).toBe(3);
  });

  it('lays the flat interlocking profile in broken bond and the deep two-channel profile in straight bond (common practice)', () => {
    // Flat interlocking (the default tile): broken bond, halves at both verges of every second course.
    const flat = roofSystemSchema.parse({});
    expect(flat.tile.bond).toBe('broken');
    const f = estimate(gable(8_940), flat).faces[0];
    expect(f.courses).toBe(9);
    expect(f.half_tiles).toBe(2 * 4); // courses 2, 4, 6, 8 from the eaves
    expect(f.whole_tiles).toBe(5 * 30 + 4 * 29);
    expect(f.tiles).toBe(5 * 30 + 4 * 29 + 4); // each pair of halves is one tile cut at the middle nail hole

    // A deep two-channel profile cannot be broken: a single-lap tile given without a bond is laid straight.
    const deep = roofSystemSchema.parse({
      tile: { ...DEFAULT_TILE, bond: undefined, cover_width_mm: { min: 297, nominal: 300, max: 303 } },
    });
    expect(deep.tile.bond).toBe('straight');
    const d = estimate(gable(8_940), deep).faces[0];
    expect(d.half_tiles).toBe(0);
    expect(d.tiles).toBe(9 * 30);
  });

  it('puts a half at the verge of a broken course that runs to a hip, and cuts the tile at the hip', () => {
    expect(vergeToRakeCourse(3_000, 45, 330, 300, false)).toEqual({ whole: 10, halves: 0, cut: 1, perimeter: 2, tah: 0 });
    expect(vergeToRakeCourse(3_000, 45, 330, 300, true)).toEqual({ whole: 9, halves: 1, cut: 1, perimeter: 2, tah: 0 });
    expect(vergeToRakeCourse(0, 45, 330, 300, true)).toEqual({ whole: 0, halves: 0, cut: 0, perimeter: 0, tah: 0 });
    expect(vergeToRakeCourse(100, 45, 330, 300, true)).toEqual({ whole: 0, halves: 1, cut: 0, perimeter: 1, tah: 0 });
  });

  it('cuts a tile at each raking edge of a course between two hips', () => {
    expect(rakeToRakeCourse(3_000, 330, 300)).toEqual({ whole: 8, halves: 0, cut: 2, perimeter: 2, tah: 0 });
    expect(rakeToRakeCourse(200, 330, 300)).toEqual({ whole: 0, halves: 0, cut: 1, perimeter: 1, tah: 0 });
    expect(rakeToRakeCourse(0, 330, 300)).toEqual({ whole: 0, halves: 0, cut: 0, perimeter: 0, tah: 0 });
  });
});
