import type { Opening } from '../../../shared/schemas/openings.schema';
import type { StoredFace, StoredOpening } from '../../../shared/schemas/schedule-upload.schema';
import { faceKey, type Face } from '../../../shared/schemas/schedule.schema';

/** A stored face as the engine reads it: the same fields the server hands the engine, in schedule order. */
export function engineFaces(faces: readonly StoredFace[]): Face[] {
  return [...faces]
    .sort((a, b) => a.position - b.position)
    .map(({ building, face, quantity, pitch_deg, rafter_mm, run_mm, eaves_mm, top_mm, left, right, top, ridge, top_assumed }) => ({
      building,
      face,
      quantity,
      pitch_deg,
      rafter_mm,
      run_mm,
      eaves_mm,
      top_mm,
      left,
      right,
      top,
      ...(ridge === null || ridge === undefined ? {} : { ridge }),
      ...(top_assumed ? { top_assumed: true } : {}),
    }));
}

/** The stored openings of each face, in the order of the faces given (building and face compared as the engine does). */
export function openingsByFace(faces: readonly Face[], openings: readonly StoredOpening[]): Opening[][] {
  const byKey = new Map<string, Opening[]>();
  for (const { building, face, kind, width_mm, height_mm, quantity } of openings) {
    const key = faceKey(building, face);
    byKey.set(key, [...(byKey.get(key) ?? []), { building, face, kind, width_mm, height_mm, quantity }]);
  }
  return faces.map((f) => byKey.get(faceKey(f.building, f.face)) ?? []);
}

/** Every stored opening as the engine reads it. */
export function engineOpenings(openings: readonly StoredOpening[]): Opening[] {
  return openings.map(({ building, face, kind, width_mm, height_mm, quantity }) => ({ building, face, kind, width_mm, height_mm, quantity }));
}
