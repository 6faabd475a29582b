import { describe, expect, it } from 'vitest';
import { roofSystemSchema } from '../schemas/roof-system.schema';
import type { Face } from '../schemas/schedule.schema';
import { estimate } from './estimate';
import { insets } from './geometry';
import { buildingEdges, faceEdgeShares, type EdgeFace } from './ridge-hip';

const FT = 304.8;

function edgeFace(f: Omit<EdgeFace, 'inset'> & { eaves_mm: number }): EdgeFace {
  return { ...f, inset: insets({ eaves_mm: f.eaves_mm, top_mm: f.top_mm, rafter_mm: f.rafter_mm, left: f.left, right: f.right }) };
}

function face(partial: Partial<Face> & Pick<Face, 'face' | 'eaves_mm' | 'rafter_mm'>): Face {
  return { building: '1', quantity: 1, pitch_deg: 35, run_mm: 1, top_mm: partial.eaves_mm, left: 'verge', right: 'verge', top: 'ridge', ...partial };
}

describe('ridge', () => {
  it('is half the top edges of the ridge faces plus the whole top of each mono-ridge face (two slopes share a ridge: common practice)', () => {
    const e = buildingEdges(
      [
        edgeFace({ quantity: 1, rafter_mm: 4_000, eaves_mm: 9_000, top_mm: 9_000, top: 'ridge', left: 'verge', right: 'verge' }),
        edgeFace({ quantity: 1, rafter_mm: 4_000, eaves_mm: 9_000, top_mm: 9_000, top: 'ridge', left: 'verge', right: 'verge' }),
        edgeFace({ quantity: 1, rafter_mm: 2_000, eaves_mm: 2_000, top_mm: 2_000, top: 'mono_ridge', left: 'verge', right: 'verge' }),
        edgeFace({ quantity: 1, rafter_mm: 2_000, eaves_mm: 3_000, top_mm: 3_000, top: 'abutment', left: 'verge', right: 'verge' }),
      ],
      420,
      420,
    );
    expect(e.ridge_mm).toBe(11_000);
  });

  it('takes ridge tiles = ridge length ÷ each tile’s exposure, rounded up (Canadian Roofing Reference Manual §9.3.3.1, published)', () => {
    const two = (len: number) => [
      edgeFace({ quantity: 1, rafter_mm: 4_000, eaves_mm: len, top_mm: len, top: 'ridge', left: 'verge', right: 'verge' }),
      edgeFace({ quantity: 1, rafter_mm: 4_000, eaves_mm: len, top_mm: len, top: 'ridge', left: 'verge', right: 'verge' }),
    ];
    expect(buildingEdges(two(4_200), 420, 420).ridge_tiles).toBe(10);
    expect(buildingEdges(two(4_201), 420, 420).ridge_tiles).toBe(11);
    expect(buildingEdges(two(9_000), 450, 420).ridge_tiles).toBe(20);
  });

  it('rounds each house’s ridge on its own when some faces of the building have another quantity (common practice)', () => {
    // 40 houses of a gable type, 20 of them with a lean-to porch: each house still needs 11 ridge tiles
    // for its 4.3 m ridge (the last one cut), so 440, not 172 m ÷ 0.42 m = 410.
    const gable = (name: string) => face({ face: name, quantity: 40, eaves_mm: 4_300, rafter_mm: 4_000 });
    const porch = face({ face: 'Porch', quantity: 20, eaves_mm: 2_000, rafter_mm: 1_500, pitch_deg: 25, top: 'abutment' });
    const r = estimate([gable('Front'), gable('Back'), porch], roofSystemSchema.parse({ waste_pct: { ridge_hip: 0 } }));
    expect(r.totals.ridge_m).toBe(172);
    expect(r.totals.ridge_tiles).toBe(40 * 11);
    expect(r.warnings.map((w) => w.code)).toContain('mixed_quantity');
  });

  it('rounds each identical house’s ridge on its own when a building has a quantity', () => {
    const q = (n: number) => [
      edgeFace({ quantity: n, rafter_mm: 4_000, eaves_mm: 4_300, top_mm: 4_300, top: 'ridge', left: 'verge', right: 'verge' }),
      edgeFace({ quantity: n, rafter_mm: 4_000, eaves_mm: 4_300, top_mm: 4_300, top: 'ridge', left: 'verge', right: 'verge' }),
    ];
    expect(buildingEdges(q(10), 420, 420)).toMatchObject({ ridge_mm: 43_000, ridge_tiles: 110, mixed_quantity: false });
  });
});

describe('hips and valleys', () => {
  it('gives a hipped roof four hips of √(rafter² + inset²): the 23.45 ft hip of the US Navy Builder manual worked example (published)', () => {
    const rafter = 18.03 * FT;
    const run = 15 * FT;
    const length = 40 * FT;
    const hipped = [
      face({ face: 'Front', eaves_mm: length, top_mm: length - 2 * run, rafter_mm: rafter, left: 'hip', right: 'hip' }),
      face({ face: 'Back', eaves_mm: length, top_mm: length - 2 * run, rafter_mm: rafter, left: 'hip', right: 'hip' }),
      face({ face: 'East', eaves_mm: 2 * run, top_mm: 0, rafter_mm: rafter, left: 'hip', right: 'hip' }),
      face({ face: 'West', eaves_mm: 2 * run, top_mm: 0, rafter_mm: rafter, left: 'hip', right: 'hip' }),
    ];
    const r = estimate(hipped, roofSystemSchema.parse({}));
    expect(r.totals.hip_m / (FT / 1000)).toBeCloseTo(4 * 23.45, 0);
    expect(r.totals.hip_m).toBeCloseTo((4 * Math.hypot(rafter, run)) / 1000, 2);
    expect(r.totals.ridge_m).toBeCloseTo((length - 2 * run) / 1000, 2);
    expect(r.warnings.filter((w) => w.code === 'odd_hip_edges')).toEqual([]);
  });

  it('gives a hipped canopy against a wall the same hip from both faces that share it (trigonometry)', () => {
    // A bay canopy: a front face between two hips, and two triangular sides, each with a hip and the wall.
    const run = 900;
    const rafter = 1_100;
    const canopy = [
      face({ face: 'Front', eaves_mm: 2 * run + 1_000, top_mm: 1_000, rafter_mm: rafter, left: 'hip', right: 'hip', top: 'abutment' }),
      face({ face: 'Left', eaves_mm: run, top_mm: 0, rafter_mm: rafter, left: 'abutment', right: 'hip', top: 'abutment' }),
      face({ face: 'Right', eaves_mm: run, top_mm: 0, rafter_mm: rafter, left: 'hip', right: 'abutment', top: 'abutment' }),
    ];
    const r = estimate(canopy, roofSystemSchema.parse({}));
    // Two hips, each √(rafter² + run²) on the slope; half from the front face, half from a side.
    expect(r.totals.hip_m).toBeCloseTo((2 * Math.hypot(rafter, run)) / 1000, 2);
    expect(r.totals.ridge_m).toBe(0);
  });

  it('halves each raking edge because two faces share it, and reports valleys apart from hips', () => {
    const s = faceEdgeShares(edgeFace({ quantity: 1, rafter_mm: 3_000, eaves_mm: 4_000, top_mm: 8_000, top: 'ridge', left: 'valley', right: 'valley' }));
    expect(s.valley).toBeCloseTo(Math.hypot(3_000, 2_000), 9); // two halves of √(3000² + 2000²)
    expect(s).toMatchObject({ hip: 0, hips: 0, valleys: 2 });
  });

  it('warns when a building lists an odd number of hip edges', () => {
    const r = estimate([face({ face: 'Front', eaves_mm: 8_000, top_mm: 4_000, rafter_mm: 4_000, left: 'hip', right: 'verge' })], roofSystemSchema.parse({}));
    expect(r.warnings.map((w) => w.code)).toContain('odd_hip_edges');
  });

  it('applies the ridge and hip waste to the tiles ordered', () => {
    const r = estimate([face({ face: 'A', eaves_mm: 8_400, rafter_mm: 4_000 }), face({ face: 'B', eaves_mm: 8_400, rafter_mm: 4_000 })], roofSystemSchema.parse({ waste_pct: { ridge_hip: 10 } }));
    expect(r.totals.ridge_m).toBe(8.4);
    expect(r.totals.ridge_tiles).toBe(22); // 20 net + 10 %
  });
});
