import { describe, expect, it } from 'vitest';
import { roofSystemSchema } from '../schemas/roof-system.schema';
import type { EdgeKind } from '../schemas/schedule.schema';
import { DEFAULT_TILE } from './defaults';
import { estimate } from './estimate';
import { settingOutMarks, settingOutReference } from './setting-out';

const face = (eaves: number, left: EdgeKind, right: EdgeKind, top = eaves) => ({
  building: '1',
  face: 'F',
  quantity: 1,
  pitch_deg: 35,
  rafter_mm: 4_000,
  run_mm: 1,
  eaves_mm: eaves,
  top_mm: top,
  left,
  right,
  top: 'ridge' as const,
});

describe('setting out', () => {
  it('starts at the right-hand verge, finds whole tiles with the side-lock play at the left verge, and marks every third tile for the chalk lines (common practice)', () => {
    const f = estimate([face(9_000, 'verge', 'verge')], roofSystemSchema.parse({})).faces[0];
    expect(f.setting_out_from).toBe('right_verge');
    // Whole tiles: 30 a course, no cut tile at the left verge, the play taken up a few mm a tile.
    expect(f.tiles_per_course).toBe(30);
    expect(f.cut_tiles).toBe(0);
    expect(f.verge_overhang_mm).toBe(45);
    const cover = (9_000 + 90 - DEFAULT_TILE.width_mm) / 29;
    expect(f.cover_width_mm).toBeCloseTo(cover, 1);
    // A mark on the joint after every third tile, measured from the right-hand verge.
    expect(f.setting_out_marks_mm).toHaveLength(9);
    expect(f.setting_out_marks_mm[0]).toBeCloseTo(3 * cover - 45, 1);
    expect(f.setting_out_marks_mm[8]).toBeCloseTo(27 * cover - 45, 1);
    for (let i = 1; i < f.setting_out_marks_mm.length; i++) {
      expect(f.setting_out_marks_mm[i] - f.setting_out_marks_mm[i - 1]).toBeCloseTo(3 * cover, 0);
    }
  });

  it('marks the joint after tiles 3, 6, 9 … and never at the last tile', () => {
    expect(settingOutMarks(10, 300, 45)).toEqual([855, 1755, 2655]);
    expect(settingOutMarks(9, 300, 45)).toEqual([855, 1755]);
    expect(settingOutMarks(3, 300, 45)).toEqual([]);
  });

  it('measures from the left verge when the right-hand side is a hip, and from the eaves end with no verge', () => {
    expect(settingOutReference('verge', 'verge')).toBe('right_verge');
    expect(settingOutReference('verge', 'hip')).toBe('left_verge');
    expect(settingOutReference('hip', 'hip')).toBe('right_end');
    const hipEnd = estimate([face(6_000, 'hip', 'hip', 0)], roofSystemSchema.parse({})).faces[0];
    expect(hipEnd.setting_out_from).toBe('right_end');
    expect(hipEnd.setting_out_marks_mm[0]).toBe(900);
  });
});
