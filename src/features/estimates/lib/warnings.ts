import type { EngineResult, EngineWarning } from '../../../../shared/engine/result';

export interface PlacedWarnings {
  /** Warnings about one face, by the face's index in the result. */
  byFace: Map<number, EngineWarning[]>;
  /** About a building as a whole (its ridge, hips, balance). */
  byBuilding: Map<string, EngineWarning[]>;
  /** About the job: delivery, pallets, the file. */
  job: EngineWarning[];
}

/** Puts each engine warning where it belongs: on its face, its building, or the job. */
export function placeWarnings(result: Pick<EngineResult, 'faces' | 'warnings'>): PlacedWarnings {
  const byFace = new Map<number, EngineWarning[]>();
  const byBuilding = new Map<string, EngineWarning[]>();
  const job: EngineWarning[] = [];
  for (const warning of result.warnings) {
    if (warning.face !== null) {
      const index = result.faces.findIndex((f) => f.face === warning.face && (warning.building === null || f.building === warning.building));
      if (index >= 0) {
        byFace.set(index, [...(byFace.get(index) ?? []), warning]);
        continue;
      }
    }
    if (warning.building !== null) byBuilding.set(warning.building, [...(byBuilding.get(warning.building) ?? []), warning]);
    else job.push(warning);
  }
  return { byFace, byBuilding, job };
}
