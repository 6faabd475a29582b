export type SettingOutFrom = 'right_verge' | 'left_verge' | 'right_end';

/**
 * Chalk-line marks along the battens, mm from the reference edge. Setting out starts at the right-hand
 * verge with the first tile overhanging it; counting three tiles at a time, a mark falls on the joint
 * after every third tile (3 × cover − overhang, 6 × cover − overhang…), up to the last joint of the
 * widest course. The lines are struck through the marks from eaves to ridge. When the right-hand side
 * is not a verge the left verge is the reference; with no verge at all, the right-hand end of the eaves
 * (no overhang). Returned to 0.1 mm.
 */
export function settingOutMarks(tilesInCourse: number, coverMm: number, overhangMm: number): number[] {
  // Worked out in a scratch row and copied at its size: a job holds one of these per face, and a copy
  // comes from no literal, which V8 would move to the old generation wholesale (DEVELOPERS.md, decision 31).
  const count = tilesInCourse > 3 ? Math.floor((tilesInCourse - 1) / 3) : 0;
  // (Written over, never emptied: setting length to 0 would drop its storage.)
  const marks = MARKS;
  for (let i = 0; i < count; i++) marks[i] = Math.round((3 * (i + 1) * coverMm - overhangMm) * 10) / 10;
  return marks.slice(0, count);
}

/** Marks being worked out (numbers only, reused from face to face). */
const MARKS: number[] = [];

/** Which edge the marks are measured from, for a face's left and right edges. */
export function settingOutReference(left: string, right: string): SettingOutFrom {
  if (right === 'verge') return 'right_verge';
  if (left === 'verge') return 'left_verge';
  return 'right_end';
}
