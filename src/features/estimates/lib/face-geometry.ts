import { planFaceBattens } from '../../../../shared/engine/battens';
import { rowHeight, setOutCourses } from '../../../../shared/engine/courses';
import { extentAt, insets } from '../../../../shared/engine/geometry';
import type { FaceShape } from '../../../../shared/engine/geometry';
import { loadingRowIndices } from '../../../../shared/engine/loading';
import type { FaceResult } from '../../../../shared/engine/result';
import type { RoofSystem } from '../../../../shared/schemas/roof-system.schema';

/** A point on the drawing in mm: x from the left-hand end of the eaves, y up the slope from the eaves line. */
export interface Point {
  x: number;
  y: number;
}

export interface DrawnBatten {
  /** Batten row from the eaves, 0 first. */
  index: number;
  y: number;
  x1: number;
  x2: number;
}

export interface DrawnStack {
  row: number;
  x: number;
  y: number;
}

export interface FaceDrawingModel {
  outline: Point[];
  width: { min: number; max: number };
  battens: DrawnBatten[];
  rafters: number[];
  /** Batten rows that carry stacks, top first, with how many each holds. */
  loadingRows: { row: number; y: number; stacks: number }[];
  stacks: DrawnStack[];
  /** Setting-out lines: x on the drawing, and the distance from the reference edge the engine gave. */
  marks: { x: number; mm: number }[];
  gauge_mm: number;
  first_batten_mm: number;
  top_batten_mm: number;
}

/** The batten rules' tolerance: a rafter this close to a row's end is the end itself. */
const HALF_MM = 0.5;

/** Rafter centres as the batten rules place them: every rafter_spacing_mm from the right-hand end of the eaves. */
function rafterPositions(fromRight: number, toRight: number, spacing: number): number[] {
  const out: number[] = [];
  for (let k = Math.ceil(fromRight / spacing); k * spacing <= toRight; k++) out.push(k * spacing);
  return out;
}

/** Places k stacks evenly over n stack positions (the rafter crossings of one batten). */
export function spreadOver(positions: readonly number[], k: number): number[] {
  const n = positions.length;
  if (k <= 0 || n === 0) return [];
  const out: number[] = [];
  for (let j = 0; j < Math.min(k, n); j++) out.push(positions[Math.round(((j + 0.5) * n) / Math.min(k, n) - 0.5)]);
  return out;
}

/**
 * Everything the face drawing shows, from the shared engine: the same course set-out, batten rows and
 * rafter crossings the estimate counted, the loading battens (every nth from the top) with the stacks
 * the engine put on each, and the setting-out marks from their reference edge. The engine measures
 * across the slope from the right-hand end of the eaves, leftwards; the drawing turns that round so x
 * runs left to right as the face is seen from the ground.
 */
export function faceDrawingModel(shape: FaceShape & { pitch_deg: number }, result: FaceResult, system: RoofSystem): FaceDrawingModel {
  const inset = insets(shape);
  const toX = (fromRight: number) => shape.eaves_mm - fromRight;
  const top = extentAt(shape, inset, shape.rafter_mm);
  const outline: Point[] = [
    { x: 0, y: 0 },
    { x: shape.eaves_mm, y: 0 },
    { x: toX(top.from), y: shape.rafter_mm },
    { x: toX(top.to), y: shape.rafter_mm },
  ];
  const xs = outline.map((p) => p.x);

  const setOut = setOutCourses(shape.rafter_mm, shape.pitch_deg, system);
  const battens: DrawnBatten[] = [];
  const supportsByRow = new Map<number, number[]>();
  const spacing = system.rafter_spacing_mm;
  if (setOut) {
    const plan = planFaceBattens(shape, inset, setOut, system, null, 1, true);
    let next = 0;
    for (let r = 0; r < setOut.courses; r++) {
      const y = rowHeight(setOut, r);
      const row = plan.rows?.[next];
      if (!row || Math.abs(row.y_mm - y) > 1e-6) continue;
      next++;
      battens.push({ index: r, y, x1: toX(row.to_mm), x2: toX(row.from_mm) });
      // The row's ends and the rafters between them, placed as the batten rules place them (k × spacing
      // from the right-hand end): the crossings the engine counted as stack positions.
      const k0 = Math.floor((row.from_mm + HALF_MM) / spacing) + 1;
      const interior = Array.from({ length: Math.max(0, row.supports - 2) }, (_, i) => (k0 + i) * spacing);
      const crossings = [row.from_mm, ...interior, row.to_mm];
      supportsByRow.set(
        r,
        crossings.map(toX).sort((a, b) => a - b),
      );
    }
  }

  const reachFrom = Math.min(0, inset.right);
  const reachTo = Math.max(shape.eaves_mm, shape.eaves_mm - inset.left);
  const rafters = rafterPositions(reachFrom, reachTo, spacing).map(toX);

  const rows = loadingRowIndices(result.courses, system.roof_loading.every_nth_batten);
  const loadingRows = rows.map((row, i) => ({ row, y: setOut ? rowHeight(setOut, row) : 0, stacks: result.stacks_by_row[i] ?? 0 }));
  const stacks: DrawnStack[] = loadingRows.flatMap((loading) => spreadOver(supportsByRow.get(loading.row) ?? [], loading.stacks).map((x) => ({ row: loading.row, x, y: loading.y })));

  const marks = result.setting_out_marks_mm.map((mm) => ({
    mm,
    x: result.setting_out_from === 'left_verge' ? mm : toX(mm),
  }));

  return {
    outline,
    width: { min: Math.min(...xs), max: Math.max(...xs) },
    battens,
    rafters,
    loadingRows,
    stacks,
    marks,
    gauge_mm: result.gauge_mm,
    first_batten_mm: setOut?.first_batten_mm ?? 0,
    top_batten_mm: setOut?.top_batten_mm ?? 0,
  };
}
