import { describe, expect, it } from 'vitest';
import { formatProblem, runEstimateFromCsv } from './estimate';
import type { EngineResult, FaceResult } from './result';

/**
 * A face the same size as the face before it (or its mirror image) takes its courses and batten
 * pieces from that face's count: the job must come out as if every face had been counted on its own,
 * which is what the same faces give when no two like faces follow each other.
 */
const HEADER = 'building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top,ridge';
const FACES: Record<string, string> = {
  front: 'Ash Cottage,Main front,2,40,,4100,11300,3100,hip,hip,ridge,Main',
  back: 'Ash Cottage,Main back,1,40,,4100,11300,3100,hip,hip,ridge,Main',
  bay: 'Ash Cottage,Bay front,1,40,,4100,11300,8300,hip,hip,abutment,',
  bayLeft: 'Ash Cottage,Bay left,1,40,,4100,11300,8300,hip,abutment,abutment,',
  wingLeft: 'Ash Cottage,Wing left,1,42,3900,,4300,7200,verge,valley,ridge,Wing',
  wingRight: 'Ash Cottage,Wing right,3,42,3900,,4300,7200,valley,verge,ridge,Wing',
  garageFront: 'Ash Cottage,Garage front,1,35,3100,,6100,,verge,verge,ridge,Garage',
  garageBack: 'Ash Cottage,Garage back,1,35,3100,,6100,,verge,verge,ridge,Garage',
  garageSide: 'Ash Cottage,Garage side,1,35,3100,,6100,6100,hip,verge,ridge,Garage',
  dormerLeft: 'Ash Cottage,Dormer left,1,45,1500,,1900,,verge,abutment,ridge,Dormer',
  dormerRight: 'Ash Cottage,Dormer right,2,45,1500,,1900,,abutment,verge,ridge,Dormer',
};
const SLATE = {
  tile: {
    kind: 'double_lap' as const,
    length_mm: 500,
    width_mm: 250,
    headlap_mm: [{ from_pitch_deg: 22.5, min_mm: 100 }],
    weight_kg: 2.2,
    per_pallet: 600,
  },
};

function run(order: string[], system?: object): EngineResult {
  const out = runEstimateFromCsv([HEADER, ...order.map((k) => FACES[k])].join('\n'), system);
  if (!out.ok) throw new Error(out.errors.map(formatProblem).join('\n'));
  return out.result;
}

function byName(faces: readonly FaceResult[]): FaceResult[] {
  return [...faces].sort((a, b) => a.face.localeCompare(b.face));
}

describe('faces like the face before them', () => {
  for (const [name, system] of [
    ['tiles', undefined],
    ['slates', SLATE],
  ] as const) {
    it(`count the same courses, battens and totals as when counted apart (${name})`, () => {
      const together = run(['front', 'back', 'bay', 'bayLeft', 'wingLeft', 'wingRight', 'garageFront', 'garageBack', 'garageSide', 'dormerLeft', 'dormerRight'], system);
      const apart = run(['front', 'wingLeft', 'bayLeft', 'garageFront', 'bay', 'back', 'wingRight', 'garageBack', 'dormerLeft', 'garageSide', 'dormerRight'], system);
      expect(byName(together.faces)).toEqual(byName(apart.faces));
      expect(together.totals).toEqual(apart.totals);
      expect(together.totals.batten_lengths).toBeGreaterThan(0);
    });
  }
});
