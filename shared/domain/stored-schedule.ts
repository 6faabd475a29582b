import type { Opening } from '../schemas/openings.schema';
import type { Face } from '../schemas/schedule.schema';
import type { StoredFace, StoredOpening } from '../schemas/schedule-upload.schema';

/**
 * A stored face as the engine reads it: the server estimating and the browser previewing hand the
 * engine the same fields, so their figures agree. An unnamed ridge and a top that was not assumed
 * are left out rather than sent as null or false.
 */
export function engineFace(f: StoredFace): Face {
  const { building, face, quantity, pitch_deg, rafter_mm, run_mm, eaves_mm, top_mm, left, right, top } = f;
  return {
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
    ...(f.ridge === null || f.ridge === undefined ? {} : { ridge: f.ridge }),
    ...(f.top_assumed ? { top_assumed: true } : {}),
  };
}

/** A stored opening as the engine reads it. */
export function engineOpening(o: StoredOpening): Opening {
  const { building, face, kind, width_mm, height_mm, quantity } = o;
  return { building, face, kind, width_mm, height_mm, quantity };
}
