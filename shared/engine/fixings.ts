import type { CoursePieces } from './bond';

export type FixingRule = 'every_tile' | 'perimeter_and_alternate_courses';

/**
 * Batten nails for one face: one at every rafter crossing of every row, and one more at each joint
 * (both batten ends are nailed to the rafter they share).
 */
export function battenNails(crossings: number, joints: number): number {
  return crossings + joints;
}

/**
 * Pieces nailed in one course (multiply by nails per tile). every_tile: every piece laid, whole, half,
 * tile-and-a-half or cut. perimeter_and_alternate_courses: every piece of the eaves course, the top course and every
 * second course (the second, fourth… from the eaves); in the other courses the verge pieces and the
 * cut pieces at hips, valleys and abutments, which are perimeter tiles too.
 */
export function nailedPieces(rule: FixingRule, course: CoursePieces, courseIndex: number, courses: number): number {
  const all = course.whole + course.halves + course.cut + course.tah;
  if (rule === 'every_tile') return all;
  if (courseIndex === 0 || courseIndex === courses - 1 || courseIndex % 2 === 1) return all;
  return Math.min(all, course.perimeter);
}
