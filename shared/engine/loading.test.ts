import { describe, expect, it } from 'vitest';
import { roofSystemSchema } from '../schemas/roof-system.schema';
import type { Face } from '../schemas/schedule.schema';
import { SYSTEM_DEFAULTS } from './defaults';
import { estimate, faceDetail } from './estimate';
import { loadingRowIndices, pairRidgeFaces, planFaceLoading } from './loading';

const sys = roofSystemSchema.parse({});
const gable = (name: string, eaves: number, rafter: number, pitch = 40): Face => ({
  building: 'A',
  face: name,
  quantity: 1,
  pitch_deg: pitch,
  rafter_mm: rafter,
  run_mm: 1,
  eaves_mm: eaves,
  top_mm: eaves,
  left: 'verge',
  right: 'verge',
  top: 'ridge',
});

describe('roof loading', () => {
  it('loads in stacks of six tiles on every second batten over the rafters, spread from the top down (common practice)', () => {
    expect(SYSTEM_DEFAULTS.roof_loading).toEqual({ stack_size: 6, every_nth_batten: 2 });
    expect(loadingRowIndices(15, 2)).toEqual([14, 12, 10, 8, 6, 4, 2]);
    const f = estimate([gable('Front', 9_000, 5_091), gable('Back', 9_000, 5_091)], sys).faces[0];
    expect(f.courses).toBe(15);
    // 16 rafters under each of the 7 loading battens.
    expect(f.stack_positions).toBe(16 * 7);
    expect(f.stacks).toBe(Math.ceil(f.tiles / 6));
    expect(f.load_kg).toBeCloseTo(f.tiles * 4.4, 1);
    expect(f.stacks_by_row).toEqual([11, 11, 11, 11, 11, 10, 10]);
    // Shared out from the top: 75 stacks over 7 battens, the odd ones on the upper battens.
    const detail = faceDetail(gable('Front', 9_000, 5_091), sys);
    expect(detail.loading).toEqual([
      { batten: 15, positions: 16, stacks: 11 },
      { batten: 13, positions: 16, stacks: 11 },
      { batten: 11, positions: 16, stacks: 11 },
      { batten: 9, positions: 16, stacks: 11 },
      { batten: 7, positions: 16, stacks: 11 },
      { batten: 5, positions: 16, stacks: 10 },
      { batten: 3, positions: 16, stacks: 10 },
    ]);
    expect(detail.battens).toHaveLength(15);
    expect(detail.face).toEqual(f);
  });

  it('counts the loading battens from the top batten down, so a hip end loads its narrow top rows too (common practice)', () => {
    const hipEnd: Face = { ...gable('East', 8_400, 5_091), top_mm: 0, left: 'hip', right: 'hip' };
    const detail = faceDetail(hipEnd, sys);
    const f = estimate([hipEnd], sys).faces[0];
    expect(f.courses).toBe(15);
    // Battens 15, 13, … 3 from the eaves carry stacks; batten 1 at the eaves does not.
    expect(detail.loading.map((l) => l.batten)).toEqual([15, 13, 11, 9, 7, 5, 3]);
    const supports = (batten: number) => detail.battens[batten - 1].supports;
    expect(detail.loading.map((l) => l.positions)).toEqual([15, 13, 11, 9, 7, 5, 3].map(supports));
    expect(f.stack_positions).toBe([15, 13, 11, 9, 7, 5, 3].map(supports).reduce((a, b) => a + b, 0));
    expect(f.stacks_by_row).toEqual(detail.loading.map((l) => l.stacks));
  });

  it('spreads evenly and passes on what a full row cannot hold to the rows below', () => {
    expect(planFaceLoading(60, [4, 4, 4], 6)).toEqual({ positions: 12, stacks: 10, stacks_by_row: [4, 3, 3], needed_stack: null });
    expect(planFaceLoading(60, [1, 10, 10], 6).stacks_by_row).toEqual([1, 5, 4]);
  });

  it('warns with the stack height it would need when there are too few positions', () => {
    const l = planFaceLoading(1_000, [10, 10], 6);
    expect(l).toMatchObject({ positions: 20, stacks: 167, needed_stack: 50, stacks_by_row: [10, 10] });
    const r = estimate([gable('Front', 600, 1_200), gable('Back', 600, 1_200)], sys);
    expect(r.warnings.some((w) => w.code === 'too_few_stack_positions')).toBe(false);
    const tight = estimate([gable('Front', 600, 1_200)], roofSystemSchema.parse({ roof_loading: { stack_size: 1 } }));
    const w = tight.warnings.find((x) => x.code === 'too_few_stack_positions');
    expect(w?.message).toMatch(/stacks of \d+ would be needed/);
  });

  it('has no positions on a face with fewer courses than the loading step, and says so', () => {
    expect(planFaceLoading(12, [], 6)).toEqual({ positions: 0, stacks: 2, stacks_by_row: [], needed_stack: 12 });
    const r = estimate([gable('Sliver', 3_000, 300)], sys);
    expect(r.faces[0]).toMatchObject({ courses: 1, stack_positions: 0 });
    expect(r.warnings.find((w) => w.code === 'too_few_stack_positions')?.message).toMatch(/stacks on every 2nd batten\): hand its \d+ tiles up/);
  });

  it('loads the roof evenly on both sides: both slopes of a ridge are paired and their difference reported (common practice)', () => {
    const r = estimate([gable('Front', 9_000, 5_091), gable('Back', 9_000, 5_091)], sys);
    expect(r.ridges).toEqual([{ building: 'A', ridge: null, faces: ['Front', 'Back'], load_kg: [r.faces[0].load_kg, r.faces[1].load_kg], difference_kg: 0 }]);
    // A steeper back slope of the same ridge carries more tiles: the difference is reported and warned.
    const uneven = estimate([gable('Front', 9_000, 3_000, 30), gable('Back', 9_000, 5_091)], sys);
    expect(uneven.ridges[0].difference_kg).toBeCloseTo(Math.abs(uneven.faces[1].load_kg - uneven.faces[0].load_kg), 1);
    expect(uneven.warnings.map((x) => x.code)).toContain('uneven_ridge_load');
  });

  it('pairs faces with the same ridge length and hip ends with each other', () => {
    const { pairs, unpaired } = pairRidgeFaces([
      { building: 'B', face: 'Front', top_mm: 1_800, load_kg: 100 },
      { building: 'B', face: 'East', top_mm: 0, load_kg: 40 },
      { building: 'B', face: 'Back', top_mm: 1_805, load_kg: 90 },
      { building: 'B', face: 'West', top_mm: 0, load_kg: 44 },
      { building: 'B', face: 'Odd', top_mm: 3_000, load_kg: 10 },
    ]);
    expect(pairs.map((p) => p.faces)).toEqual([
      ['Front', 'Back'],
      ['East', 'West'],
    ]);
    expect(pairs.map((p) => p.difference_kg)).toEqual([10, 4]);
    expect(unpaired.map((u) => u.face)).toEqual(['Odd']);
  });
});
