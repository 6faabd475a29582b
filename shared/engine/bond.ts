import { tilesToSpan, type VergeFit } from './tiles-per-course';

/** Pieces of one course. Cut tiles are taken from whole tiles; halves are counted separately. */
export interface CoursePieces {
  whole: number;
  halves: number;
  cut: number;
  /** Pieces at the verges and cut pieces at raking edges: the perimeter of the course. */
  perimeter: number;
  /** Tiles-and-a-half (slates-and-a-half) at the verges of a broken double-lap course. */
  tah: number;
}

function pieces(out: CoursePieces | undefined, whole: number, halves: number, cut: number, perimeter: number, tah = 0): CoursePieces {
  if (!out) return { whole, halves, cut, perimeter, tah };
  out.whole = whole;
  out.halves = halves;
  out.cut = cut;
  out.perimeter = perimeter;
  out.tah = tah;
  return out;
}

/**
 * Double lap (plain tiles, slates) keeps the bond in every second full course, starting with the
 * second full course from the eaves: course index 2, 4, … of a face whose course 0 is the under-eaves
 * course, never the top course (index courses − 1).
 */
export function isDoubleLapBrokenCourse(courseIndex: number, courses: number): boolean {
  return courseIndex >= 2 && courseIndex <= courses - 2 && courseIndex % 2 === 0;
}

/**
 * A broken double-lap course between two verges: the bond is kept with a tile-and-a-half at each
 * verge in place of a half and a whole, so n − 3 whole tiles and two tiles-and-a-half cover the width
 * of n tiles (a further cut tile when no whole number fits). A course under three tiles wide is laid
 * straight.
 */
export function doubleLapVergeCourse(fit: VergeFit, out?: CoursePieces): CoursePieces {
  const n = fit.tiles;
  const cut = fit.fits ? 0 : 1;
  if (n < 3) return pieces(out, n - cut, 0, cut, Math.min(n, 2));
  return pieces(out, Math.max(0, n - 3 - cut), 0, cut, 2 + cut, 2);
}

/**
 * Turns the half at the verge of a broken verge-to-rake course into a tile-and-a-half (double lap):
 * one whole tile fewer, no half. Writes into `course`.
 */
export function halfToTileAndHalf(course: CoursePieces): CoursePieces {
  if (course.halves > 0) {
    course.whole = Math.max(0, course.whole - 1);
    course.halves = 0;
    course.tah = 1;
  }
  return course;
}

/** Broken bond shifts every second course by half a tile, starting with the second from the eaves. */
export function isBrokenCourse(bond: 'broken' | 'straight', courseIndex: number): boolean {
  return bond === 'broken' && courseIndex % 2 === 1;
}

/**
 * A course between two verges. Straight: n whole tiles (or n − 1 and a cut tile when no whole number
 * fits). Broken: n − 1 whole tiles and a half at each verge (a further cut tile when none fits). A face
 * one tile wide has no bond to break.
 */
export function vergeCourse(fit: VergeFit, broken: boolean, out?: CoursePieces): CoursePieces {
  const n = fit.tiles;
  const cut = fit.fits ? 0 : 1;
  if (!broken || n < 2) {
    return pieces(out, n - cut, 0, cut, Math.min(n, 2));
  }
  return pieces(out, Math.max(0, n - 1 - cut), 2, cut, 2 + (fit.fits ? 0 : 1));
}

/**
 * A course with a verge on one side and a raking edge (hip, valley or abutment) on the other, mm.
 * Tiles run from the verge (overhanging it) to the raking edge, where the last tile is cut along the
 * rake. In a broken course the verge piece is a half. The raking cut is always counted: the edge
 * crosses the tile on a slant.
 */
export function vergeToRakeCourse(courseWidthMm: number, overhangMm: number, tileWidthMm: number, coverMm: number, broken: boolean, out?: CoursePieces): CoursePieces {
  if (!(courseWidthMm > 0)) return pieces(out, 0, 0, 0, 0);
  const span = courseWidthMm + overhangMm;
  if (!broken) {
    const n = tilesToSpan(span, tileWidthMm, coverMm);
    // The verge tile and the raking cut are both perimeter pieces; a one-tile course is both at once.
    return pieces(out, n - 1, 0, 1, Math.min(n, 2));
  }
  // A half covers half a tile's cover and shows its lock beyond that, like a whole tile.
  if (span <= tileWidthMm - coverMm / 2 + 1e-7) {
    return pieces(out, 0, 1, 0, 1);
  }
  const m = tilesToSpan(span - coverMm / 2, tileWidthMm, coverMm);
  return pieces(out, Math.max(0, m - 1), 1, m > 0 ? 1 : 0, 1 + (m > 0 ? 1 : 0));
}

/**
 * A course between two raking edges (a hip end, or a face between hips and valleys), mm: the tiles to
 * span the course, with a cut piece at each raking edge.
 */
export function rakeToRakeCourse(courseWidthMm: number, tileWidthMm: number, coverMm: number, out?: CoursePieces): CoursePieces {
  const n = tilesToSpan(courseWidthMm, tileWidthMm, coverMm);
  const cut = Math.min(n, 2);
  return pieces(out, n - cut, 0, cut, cut);
}

/** Whole tiles taken from the pallet for a number of halves: one a half, or one for two halves. */
export function tilesForHalves(halves: number, halvesPerTile: 1 | 2): number {
  return halvesPerTile === 2 ? Math.ceil(halves / 2) : halves;
}
