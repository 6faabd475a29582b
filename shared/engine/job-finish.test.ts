import { describe, expect, it } from 'vitest';
import { roofSystemSchema } from '../schemas/roof-system.schema';
import type { Face } from '../schemas/schedule.schema';
import { estimate } from './estimate';

// The job's finish keeps each building's edges and ridge faces in tallies reused from job to job
// (DEVELOPERS.md, decision 40): these tests hold it to the same ridges whatever order the faces come in
// and whatever job came before.

const system = roofSystemSchema.parse({});

function face(partial: Partial<Face> & Pick<Face, 'building' | 'face' | 'eaves_mm' | 'rafter_mm'>): Face {
  return { quantity: 1, pitch_deg: 35, run_mm: 1, top_mm: partial.eaves_mm, left: 'verge', right: 'verge', top: 'ridge', ...partial };
}

/** A hipped house (four faces on ridge "Main", one hip end listed alone) and a gable garage, one face naming no ridge. */
function house(building: string, eaves: number): Face[] {
  return [
    face({ building, face: 'Front', eaves_mm: eaves, top_mm: eaves - 6_000, rafter_mm: 4_000, left: 'hip', right: 'hip', ridge: 'Main' }),
    face({ building, face: 'Back', eaves_mm: eaves, top_mm: eaves - 6_000, rafter_mm: 4_000, left: 'hip', right: 'hip', ridge: 'main ' }),
    face({ building, face: 'East', eaves_mm: 6_000, top_mm: 0, rafter_mm: 4_000, left: 'hip', right: 'hip', ridge: 'MAIN' }),
    face({ building, face: 'Porch', eaves_mm: 2_000, rafter_mm: 1_500, pitch_deg: 25, top: 'abutment' }),
  ];
}

function garage(building: string): Face[] {
  return [
    face({ building, face: 'Garage front', eaves_mm: 5_400, rafter_mm: 3_000, ridge: 'Garage' }),
    face({ building, face: 'Garage back', eaves_mm: 5_400, rafter_mm: 3_000 }),
    face({ building, face: 'Store', eaves_mm: 2_400, rafter_mm: 2_000, top: 'mono_ridge', ridge: 'Store' }),
  ];
}

/** The faces of the buildings one after another from each in turn, as a schedule sorted by face might list them. */
function interleaved(...buildings: Face[][]): Face[] {
  const out: Face[] = [];
  for (let k = 0; out.length < buildings.reduce((n, b) => n + b.length, 0); k++) for (const b of buildings) if (k < b.length) out.push(b[k]);
  return out;
}

const buildingWarnings = (faces: Face[]) =>
  estimate(faces, system)
    .warnings.filter((w) => w.face === null || w.code === 'unpaired_ridge_face')
    .map((w) => `${w.building} ${w.code} ${w.face ?? ''}`)
    .sort();

describe("the job's finish", () => {
  it('gives each building the same ridges, edges and warnings when its faces are listed between other buildings’ faces', () => {
    const a = [...house('A', 11_000), ...garage('A')];
    const b = [...house('B', 9_500), ...garage('B')];
    const together = estimate([...a, ...b], system);
    const mixed = estimate(interleaved(a, b), system);
    expect(mixed.ridges).toEqual(together.ridges);
    for (const k of ['ridge_m', 'hip_m', 'ridge_tiles', 'hip_tiles', 'valley_m'] as const) expect(mixed.totals[k]).toBe(together.totals[k]);
    expect(buildingWarnings(interleaved(a, b))).toEqual(buildingWarnings([...a, ...b]));
    // Each ridge named without case or outer spaces is one ridge of its own building's faces.
    expect(mixed.ridges.filter((r) => r.ridge === 'Main').map((r) => [r.building, r.faces])).toEqual([
      ['A', ['Front', 'Back', 'East']],
      ['B', ['Front', 'Back', 'East']],
    ]);
  });

  it('gives a job the same result after a bigger job as on its own', () => {
    const small = [...house('S', 10_000), ...garage('S')];
    const alone = estimate(small, system);
    const big: Face[] = [];
    for (let h = 1; h <= 40; h++) big.push(...house(`H${h}`, 9_000 + 50 * h), ...garage(`H${h}`));
    estimate(interleaved(big.slice(0, 150), big.slice(150)), system);
    expect(estimate(small, system)).toEqual(alone);
  });
});
