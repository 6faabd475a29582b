import type { StoredFace } from '../../../shared/schemas/schedule-upload.schema';
import type { Face } from '../../../shared/schemas/schedule.schema';

/** A stored face as the engine reads it: the same fields the server hands the engine, in schedule order. */
export function engineFaces(faces: readonly StoredFace[]): Face[] {
  return [...faces]
    .sort((a, b) => a.position - b.position)
    .map(({ building, face, quantity, pitch_deg, rafter_mm, run_mm, eaves_mm, top_mm, left, right, top }) => ({
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
    }));
}
