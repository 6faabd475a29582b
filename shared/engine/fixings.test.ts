import { describe, expect, it } from 'vitest';
import { roofSystemSchema } from '../schemas/roof-system.schema';
import { planFaceBattens } from './battens';
import { setOutCourses } from './courses';
import { estimate } from './estimate';
import { insets } from './geometry';
import { battenNails, nailedPieces } from './fixings';

const course = { whole: 10, halves: 2, cut: 1, perimeter: 3, tah: 0 };

describe('batten nails', () => {
  it('puts one nail at every rafter crossing and one more at each joint', () => {
    expect(battenNails(16, 0)).toBe(16);
    expect(battenNails(16, 2)).toBe(18);
  });

  it('nails a 9 m gable: 16 crossings a row, plus the joints', () => {
    const face = { building: '1', face: 'F', quantity: 1, pitch_deg: 35, rafter_mm: 370 + 8 * 320 + 40, run_mm: 1, eaves_mm: 9_000, top_mm: 9_000, left: 'verge' as const, right: 'verge' as const, top: 'ridge' as const };
    const system = roofSystemSchema.parse({});
    const r = estimate([face], system);
    const setOut = setOutCourses(face.rafter_mm, 35, system);
    if (!setOut) throw new Error('no set-out');
    const plan = planFaceBattens(face, insets(face), setOut, system, null, 1, true);
    const joints = (plan.rows ?? []).reduce((n, row) => n + row.joints_mm.length, 0);
    // 9 rows of 16 crossings; 9000 mm needs at least two pieces a row (4800 max), so a joint or more a row.
    expect(setOut.courses).toBe(9);
    expect(joints).toBeGreaterThanOrEqual(9);
    expect(r.totals.batten_nails).toBe(9 * 16 + joints);
  });
});

describe('tile nails', () => {
  it('nails every piece laid, whole, half or cut, under the every-tile rule (BS 5534:2014 as summarised by a roofing consultant, secondary: every single-lap tile mechanically fixed)', () => {
    expect(nailedPieces('every_tile', course, 3, 10)).toBe(13);
  });

  it('under the perimeter rule nails all of the eaves course, the top course and every second course (common practice)', () => {
    expect(nailedPieces('perimeter_and_alternate_courses', course, 0, 10)).toBe(13);
    expect(nailedPieces('perimeter_and_alternate_courses', course, 9, 10)).toBe(13);
    expect(nailedPieces('perimeter_and_alternate_courses', course, 1, 10)).toBe(13);
    expect(nailedPieces('perimeter_and_alternate_courses', course, 5, 10)).toBe(13);
  });

  it('in the other courses nails only the perimeter pieces: verge tiles and cuts at hips and valleys (BS 5534:2014 as summarised by a roofing consultant, secondary: perimeter tiles fixed)', () => {
    expect(nailedPieces('perimeter_and_alternate_courses', course, 2, 10)).toBe(3);
    expect(nailedPieces('perimeter_and_alternate_courses', { whole: 1, halves: 0, cut: 0, perimeter: 2, tah: 0 }, 2, 10)).toBe(1);
  });

  it('counts nails_per_tile for each nailed piece and warns about the perimeter rule at 45° and above (BS 5534:2014 as summarised, secondary: one nail a tile from 45°)', () => {
    const face = { building: '1', face: 'F', quantity: 2, pitch_deg: 50, rafter_mm: 370 + 4 * 320 + 40, run_mm: 1, eaves_mm: 8_940, top_mm: 8_940, left: 'verge' as const, right: 'verge' as const, top: 'ridge' as const };
    const every = estimate([face], roofSystemSchema.parse({ fixing: { rule: 'every_tile' } }));
    const f = every.faces[0];
    expect(every.totals.tile_nails).toBe(2 * (f.whole_tiles + f.half_tiles + f.cut_tiles));
    const two = estimate([face], roofSystemSchema.parse({ tile: { ...roofSystemSchema.parse({}).tile, nails_per_tile: 2 } }));
    expect(two.totals.tile_nails).toBe(2 * every.totals.tile_nails);
    const perimeter = estimate([face], roofSystemSchema.parse({ fixing: { rule: 'perimeter_and_alternate_courses' } }));
    // 5 courses: 0, 1, 3, 4 fully nailed; course 2 (straight, 30 tiles) only its two verge tiles.
    expect(perimeter.totals.tile_nails).toBe(every.totals.tile_nails - 2 * 28);
    expect(perimeter.warnings.map((w) => w.code)).toContain('fixing_rule_pitch');
  });
});
