/** Batten rows (0 = eaves) that carry stacks: every nth from the top row down, floor(courses ÷ n) of them. */
export function loadingRowIndices(courses: number, everyNth: number): number[] {
  const count = Math.floor(courses / everyNth);
  const rows: number[] = [];
  for (let i = 0; i < count; i++) rows.push(courses - 1 - i * everyNth);
  return rows;
}

/** Stacks by row while they are shared out (numbers only, reused from face to face). */
const PLACED: number[] = [];

export interface FaceLoading {
  /** Places for a stack: rafters crossed by the loading rows. */
  positions: number;
  stacks: number;
  /** Stacks on each loading batten, the top one first (loading battens are every nth from the top). */
  stacks_by_row: number[];
  /** Tiles a stack would need to hold when there are too few positions; null when they suffice. */
  needed_stack: number | null;
}

/**
 * Roof loading of one face: stacks of stack_size tiles over the rafters on every nth batten, spread
 * evenly from the top of the face down (upper rows take any odd stack). Stacks = ceil(tiles ÷ stack
 * size). `rowPositions` gives the rafters crossed by each loading row, top row first (its first `rows`
 * entries). `out`, when given, receives the result (a big job plans one face after another).
 */
export function planFaceLoading(tiles: number, rowPositions: readonly number[], stackSize: number, rows: number = rowPositions.length, out?: FaceLoading): FaceLoading {
  const stacks = Math.ceil(tiles / stackSize);
  let positions = 0;
  let open = 0;
  for (let i = 0; i < rows; i++) {
    const p = rowPositions[i];
    positions += p;
    if (p > 0) open++;
  }
  // Counted in a scratch row and copied out at its size: a job holds one of these per face, and a copy
  // comes from no literal (see FaceFigures in estimate.ts).
  // (Written over, never emptied: setting length to 0 would drop its storage.)
  const placed = PLACED;
  if (positions === 0) {
    for (let i = 0; i < rows; i++) placed[i] = 0;
    return loadingResult(out, positions, stacks, stacksRow(out, placed, rows), stacks > 0 ? tiles : null);
  }
  let left = Math.min(stacks, positions);
  // Share out evenly in rounds so a full row passes its share on to the rows below it. The first round
  // starts from empty rows, so it writes every row.
  let share = Math.floor(left / open);
  let extra = left - share * open;
  for (let i = 0; i < rows; i++) {
    const p = rowPositions[i];
    if (p <= 0) {
      placed[i] = 0;
      continue;
    }
    const want = share + (extra > 0 ? 1 : 0);
    if (extra > 0) extra--;
    const take = want < p ? want : p;
    placed[i] = take;
    left -= take;
  }
  while (left > 0) {
    open = 0;
    for (let i = 0; i < rows; i++) if (placed[i] < rowPositions[i]) open++;
    if (open === 0) break;
    share = Math.floor(left / open);
    extra = left - share * open;
    for (let i = 0; i < rows; i++) {
      if (placed[i] >= rowPositions[i]) continue;
      const want = share + (extra > 0 ? 1 : 0);
      if (extra > 0) extra--;
      const take = Math.min(want, rowPositions[i] - placed[i]);
      placed[i] += take;
      left -= take;
    }
  }
  return loadingResult(out, positions, stacks, stacksRow(out, placed, rows), stacks > positions ? Math.ceil(tiles / positions) : null);
}

/**
 * The stacks by row just counted in `placed`: the row of the face planned before with `out` when it is
 * the same (like faces of one result share it: a result's arrays are read, never written to), else a
 * copy at its size.
 */
function stacksRow(out: FaceLoading | undefined, placed: readonly number[], rows: number): number[] {
  const last = out?.stacks_by_row;
  if (last !== undefined && last.length === rows) {
    let i = 0;
    while (i < rows && last[i] === placed[i]) i++;
    if (i === rows) return last;
  }
  return placed.slice(0, rows);
}

function loadingResult(out: FaceLoading | undefined, positions: number, stacks: number, placed: number[], neededStack: number | null): FaceLoading {
  if (!out) return { positions, stacks, stacks_by_row: placed, needed_stack: neededStack };
  out.positions = positions;
  out.stacks = stacks;
  out.stacks_by_row = placed;
  out.needed_stack = neededStack;
  return out;
}

export interface RidgeSide {
  building: string;
  face: string;
  top_mm: number;
  load_kg: number;
}

export interface RidgeBalance {
  building: string;
  /** The ridge's name from the schedule; null when the faces were paired by their top length. */
  ridge: string | null;
  /** Faces meeting at the ridge, in schedule order (two when paired by top length). */
  faces: string[];
  load_kg: number[];
  /**
   * Heaviest less lightest slope (faces with a top edge); hip ends (top 0) are compared with each
   * other, and the larger of the two differences is given.
   */
  difference_kg: number;
}

function sameRidge(a: number, b: number): boolean {
  if (a === 0 || b === 0) return a === b;
  return Math.abs(a - b) <= 0.01 * Math.max(a, b);
}

/**
 * Pairs the faces of one building that meet at a ridge, so both slopes can be loaded in step: faces
 * with the same top length (within 1 %) pair in schedule order, and hip ends (top 0) pair with each
 * other at the two ends of the ridge. Returns the pairs and the faces left without a partner.
 */
export function pairRidgeFaces(sides: readonly RidgeSide[]): { pairs: RidgeBalance[]; unpaired: RidgeSide[] } {
  const pairs: RidgeBalance[] = [];
  const unpaired: RidgeSide[] = [];
  const partner: number[] = new Array<number>(sides.length).fill(-1);
  for (let i = 0; i < sides.length; i++) {
    if (partner[i] >= 0) continue;
    for (let j = i + 1; j < sides.length; j++) {
      if (partner[j] < 0 && sameRidge(sides[i].top_mm, sides[j].top_mm)) {
        partner[i] = j;
        partner[j] = i;
        break;
      }
    }
  }
  // Pairs in the order their second face is listed, as a person reads the schedule.
  for (let j = 0; j < sides.length; j++) {
    const i = partner[j];
    if (i < 0) {
      unpaired.push(sides[j]);
      continue;
    }
    if (i > j) continue;
    const other = sides[i];
    const side = sides[j];
    pairs.push({
      building: side.building,
      ridge: null,
      faces: [other.face, side.face],
      load_kg: [other.load_kg, side.load_kg],
      difference_kg: Math.round(Math.abs(other.load_kg - side.load_kg) * 10) / 10,
    });
  }
  return { pairs, unpaired };
}
