import { engineFace, engineOpening } from '../../../shared/domain/stored-schedule';
import type { Opening } from '../../../shared/schemas/openings.schema';
import type { StoredFace, StoredOpening } from '../../../shared/schemas/schedule-upload.schema';
import { faceKey, type Face } from '../../../shared/schemas/schedule.schema';

/** The stored faces as the engine reads them, in schedule order (the same fields the server hands the engine). */
export function engineFaces(faces: readonly StoredFace[]): Face[] {
  return [...faces].sort((a, b) => a.position - b.position).map(engineFace);
}

/** The stored openings of each face, in the order of the faces given (building and face compared as the engine does). */
export function openingsByFace(faces: readonly Face[], openings: readonly StoredOpening[]): Opening[][] {
  const byKey = new Map<string, Opening[]>();
  for (const o of openings) {
    const key = faceKey(o.building, o.face);
    byKey.set(key, [...(byKey.get(key) ?? []), engineOpening(o)]);
  }
  return faces.map((f) => byKey.get(faceKey(f.building, f.face)) ?? []);
}

/** Every stored opening as the engine reads it. */
export function engineOpenings(openings: readonly StoredOpening[]): Opening[] {
  return openings.map(engineOpening);
}
