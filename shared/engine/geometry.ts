import type { EdgeKind } from '../schemas/schedule.schema';

/** The shape of one roof face on the slope: a trapezoid with its eaves at the bottom. */
export interface FaceShape {
  eaves_mm: number;
  top_mm: number;
  rafter_mm: number;
  left: EdgeKind;
  right: EdgeKind;
}

const DEG = Math.PI / 180;

/** Slope factor 1 ÷ cos(pitch): slope area per unit of plan area. */
export function slopeFactor(pitchDeg: number): number {
  return 1 / Math.cos(pitchDeg * DEG);
}

/** Rafter (slope) length in mm from its run on plan in mm: run ÷ cos(pitch). */
export function rafterFromRun(runMm: number, pitchDeg: number): number {
  return runMm / Math.cos(pitchDeg * DEG);
}

/** Slope area in m² of a trapezoidal face: (eaves + top) ÷ 2 × rafter, lengths in mm. */
export function slopeAreaM2(face: Pick<FaceShape, 'eaves_mm' | 'top_mm' | 'rafter_mm'>): number {
  return ((face.eaves_mm + face.top_mm) / 2) * face.rafter_mm * 1e-6;
}

/** Plan area in m² from slope area in m²: slope × cos(pitch). */
export function planAreaM2(slopeArea: number, pitchDeg: number): number {
  return slopeArea * Math.cos(pitchDeg * DEG);
}

/**
 * Length of a raking edge (hip or valley line on the slope) in mm: √(rafter² + inset²), where the inset
 * is how far the top edge is set back on that side. For an equal-pitch hip this is the hip rafter.
 */
export function rakingEdgeLength(rafterMm: number, insetMm: number): number {
  return Math.sqrt(rafterMm * rafterMm + insetMm * insetMm);
}

/** Hip or valley rafter from its run on plan and its rise: √(run² + rise²), any one unit. */
export function hipRafterLength(run: number, rise: number): number {
  return Math.sqrt(run * run + rise * rise);
}

export function isRaking(edge: EdgeKind): boolean {
  return edge !== 'verge';
}

/** A hip or valley runs diagonally on plan, so the top edge's set-back belongs to it before an abutment. */
function isDiagonal(edge: EdgeKind): boolean {
  return edge === 'hip' || edge === 'valley';
}

/**
 * How far the top edge is set back from the eaves at each side, in mm. A verge is square to the eaves and
 * takes none. Hips and valleys take the whole set-back (eaves − top), shared equally between two; an
 * abutment takes a share only when the other side is not a hip or valley, because a wall beside a hip
 * (the side of a bay or porch canopy) runs square up the slope. So both faces of one hip give it the
 * same length. Negative when the face widens upwards (a valley face). Writes into `out` when given.
 */
export function insets(face: FaceShape, out: { left: number; right: number } = { left: 0, right: 0 }): { left: number; right: number } {
  const setBack = face.eaves_mm - face.top_mm;
  const diagonal = isDiagonal(face.left) || isDiagonal(face.right);
  const l = diagonal ? isDiagonal(face.left) : isRaking(face.left);
  const r = diagonal ? isDiagonal(face.right) : isRaking(face.right);
  out.left = l ? (r ? setBack / 2 : setBack) : 0;
  out.right = r ? (l ? setBack / 2 : setBack) : 0;
  return out;
}

export interface Extent {
  from: number;
  to: number;
}

/**
 * Where the face runs across the slope at a height y (mm up the slope from the eaves line), as
 * distances from the right-hand end of the eaves, measured leftwards. y is held within the face.
 * Writes into `out` when given (hot loops reuse one object).
 */
export function extentAt(face: FaceShape, inset: { left: number; right: number }, y: number, out: Extent = { from: 0, to: 0 }): Extent {
  const t = face.rafter_mm > 0 ? Math.min(Math.max(y / face.rafter_mm, 0), 1) : 0;
  const from = inset.right * t;
  const to = face.eaves_mm - inset.left * t;
  out.from = from;
  out.to = to > from ? to : from;
  return out;
}

/** Width of the face in mm at height y up the slope. */
export function widthAt(face: FaceShape, y: number): number {
  const t = face.rafter_mm > 0 ? Math.min(Math.max(y / face.rafter_mm, 0), 1) : 0;
  return Math.max(0, face.eaves_mm + (face.top_mm - face.eaves_mm) * t);
}
