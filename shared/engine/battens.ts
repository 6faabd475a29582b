import type { RoofSystem } from '../schemas/roof-system.schema';
import { rowHeight, type CourseSetOut } from './courses';
import { extentAt, type Extent, type FaceShape } from './geometry';

/** Half a millimetre: a rafter this close to a row's end is the end support itself. */
const TOL = 0.5;

/**
 * Pieces of batten cut for the job: how many of each length in whole mm (never above the stock
 * length). Shared by all faces of a job so the offcuts of one face can be used on another.
 */
export class PieceTally {
  readonly stockMm: number;
  /** Pieces of each length in whole mm, by length. */
  readonly counts: Float64Array;
  constructor(stockMm: number) {
    this.stockMm = Math.floor(stockMm);
    this.counts = new Float64Array(this.stockMm + 1);
  }
  add(mm: number, count: number) {
    this.counts[mm] += count;
  }
  get(mm: number): number {
    return this.counts[mm] ?? 0;
  }
  /** [length mm, count] pairs, longest first. */
  longestFirst(): Array<[number, number]> {
    const out: Array<[number, number]> = [];
    for (let mm = this.stockMm; mm > 0; mm--) if (this.counts[mm] > 0) out.push([mm, this.counts[mm]]);
    return out;
  }
}

/**
 * Scratch space for the joint-stagger check, reused from face to face, and the pieces (whole mm) the
 * last face planned was cut into, so a face of the same shape can add them to the tally again.
 */
export class JointScratch {
  buffer = new Int32Array(64);
  readonly extent: Extent = { from: 0, to: 0 };
  pieces = new Int32Array(256);
  pieceCount = 0;
  take(size: number): Int32Array {
    if (this.buffer.length < size) this.buffer = new Int32Array(Math.max(size, this.buffer.length * 2));
    this.buffer.fill(-1000, 0, size);
    return this.buffer;
  }
  keep(mm: number) {
    if (this.pieceCount === this.pieces.length) {
      const grown = new Int32Array(this.pieces.length * 2);
      grown.set(this.pieces);
      this.pieces = grown;
    }
    this.pieces[this.pieceCount++] = mm;
  }
}

export interface BattenRow {
  /** Height of the row up the slope from the eaves line, mm. */
  y_mm: number;
  /** Ends of the row, mm from the right-hand end of the eaves, measured leftwards. */
  from_mm: number;
  to_mm: number;
  /** Pieces from right to left, mm. */
  pieces_mm: number[];
  /** Rafters the joints fall on, as mm from the right-hand end of the eaves. */
  joints_mm: number[];
  /** Rafter crossings: both ends and every rafter between (each gets a nail). */
  supports: number;
}

export interface FaceBattens {
  /** Sum of the row lengths on one face, mm. */
  batten_mm: number;
  /** Rafter crossings over all rows of one face. */
  crossings: number;
  joints: number;
  /** Joints that had to fall on a rafter already jointed in one of the three rows below. */
  stagger_relaxed: number;
  /** Pieces shorter than the minimum in a row long enough to avoid them (only with odd systems). */
  forced_short: number;
  /** Rows in detail, when asked for (drawings and tests). */
  rows?: BattenRow[];
}

/** Position of support idx of a row: its ends, and the rafters between at k × spacing. */
function supportAt(idx: number, n: number, from: number, to: number, k0: number, s: number): number {
  return idx === 0 ? from : idx === n - 1 ? to : (k0 + idx - 1) * s;
}

/**
 * Adds to `tally`, `quantity` times, the pieces of the face `planFaceBattens` last planned with
 * `scratch`: the same as planning again a face of the same shape, set-out and system.
 */
export function addLastFacePieces(tally: PieceTally, quantity: number, scratch: JointScratch) {
  const pieces = scratch.pieces;
  for (let i = 0, n = scratch.pieceCount; i < n; i++) tally.add(pieces[i], quantity);
}

/**
 * The battens of one face: one row per course, as long as the face is wide at that row, cut into
 * pieces that start and end on a rafter (or at the row's ends), span at least min_supports rafters and
 * are at least min_length_mm long (unless the whole row is shorter), and no longer than a stock length.
 * No more than one joint in any four consecutive rows falls on the same rafter (rule for gauges over
 * 200 mm, and it meets the three-in-twelve rule for smaller gauges too). Pieces are added to `tally`
 * `quantity` times. Rafters sit at rafter_spacing_mm centres from the right-hand end of the eaves.
 * `supportsByRow`, when given, receives each row's rafter crossings at its index (0 for a row of no
 * length; entries past the face's courses are left as they were);
 * `out`, when given, receives the result.
 */
export function planFaceBattens(
  shape: FaceShape,
  inset: { left: number; right: number },
  setOut: CourseSetOut,
  system: RoofSystem,
  tally: PieceTally | null,
  quantity: number,
  detail = false,
  scratch: JointScratch = new JointScratch(),
  supportsByRow?: number[],
  out?: FaceBattens,
): FaceBattens {
  const s = system.rafter_spacing_mm;
  const stock = system.batten.stock_length_mm;
  const minSupports = system.batten.min_supports;
  const minLength = system.batten.min_length_mm;

  // Rafter indices a face can reach, allowing for a face that widens upwards past the eaves' ends.
  const reachFrom = Math.min(0, inset.right);
  const reachTo = Math.max(shape.eaves_mm, shape.eaves_mm - inset.left);
  const kLow = Math.floor(reachFrom / s) - 1;
  const kHigh = Math.ceil(reachTo / s) + 1;
  const lastJointRow = scratch.take(kHigh - kLow + 1);
  scratch.pieceCount = 0;
  const extent = scratch.extent;

  const result: FaceBattens = out ?? { batten_mm: 0, crossings: 0, joints: 0, stagger_relaxed: 0, forced_short: 0 };
  result.batten_mm = 0;
  result.crossings = 0;
  result.joints = 0;
  result.stagger_relaxed = 0;
  result.forced_short = 0;
  const rows: BattenRow[] | undefined = detail ? [] : undefined;

  // Whole mm a piece is counted in (never above the stock length), the tally's counts, and the pieces
  // this face is cut into (kept so a like face can add them again): written here, not through a call a piece.
  const stockMm = Math.floor(stock);
  const counts = tally === null ? null : tally.counts;
  for (let r = 0; r < setOut.courses; r++) {
    const y = rowHeight(setOut, r);
    extentAt(shape, inset, y, extent);
    const from = extent.from;
    const to = extent.to;
    const length = to - from;
    if (!(length > TOL)) {
      if (supportsByRow) supportsByRow[r] = 0;
      continue;
    }
    result.batten_mm += length;

    const k0 = Math.floor((from + TOL) / s) + 1;
    const interior = interiorRafters(from, to, s);
    const n = interior + 2;
    result.crossings += n;
    if (supportsByRow) supportsByRow[r] = n;

    const row: BattenRow | undefined = rows ? { y_mm: y, from_mm: from, to_mm: to, pieces_mm: [], joints_mm: [], supports: n } : undefined;

    let i = 0;
    let start = from;
    for (;;) {
      let end: number;
      let chosen = -1;
      if (to - start <= stock + TOL) {
        end = to;
      } else {
        const jMax = Math.min(interior, Math.floor((start + stock + TOL) / s) - k0 + 1);
        // Pass 0 keeps every rule; pass 1 lets a joint repeat a rafter; pass 2 takes the longest piece.
        for (let pass = 0; pass < 3 && chosen < 0; pass++) {
          const jLow = pass < 2 ? Math.max(i + 1, i + minSupports - 1) : i + 1;
          for (let j = jMax; j >= jLow; j--) {
            const p = supportAt(j, n, from, to, k0, s);
            if (pass < 2) {
              if (p - start < minLength - TOL) break;
              if (n - j < minSupports || to - p < minLength - TOL) continue;
              if (pass === 0 && lastJointRow[k0 + j - 1 - kLow] >= r - 3) continue;
            }
            chosen = j;
            if (pass === 1) result.stagger_relaxed++;
            if (pass === 2) result.forced_short++;
            break;
          }
        }
        if (chosen < 0) chosen = Math.max(i + 1, jMax);
        end = supportAt(chosen, n, from, to, k0, s);
        lastJointRow[k0 + chosen - 1 - kLow] = r;
        result.joints++;
      }
      let mm = Math.ceil(end - start - 1e-3);
      if (mm < 1) mm = 1;
      if (mm > stockMm) mm = stockMm;
      if (counts !== null) counts[mm] += quantity;
      scratch.keep(mm);
      if (row) row.pieces_mm.push(mm);
      if (chosen < 0) break;
      if (row) row.joints_mm.push(end);
      i = chosen;
      start = end;
    }
    if (rows && row) rows.push(row);
  }
  if (rows) result.rows = rows;
  return result;
}

/** Rafters strictly between the ends of a row from `from` to `to` (mm), rafters at k × spacing. */
export function interiorRafters(from: number, to: number, spacingMm: number): number {
  const k0 = Math.floor((from + TOL) / spacingMm) + 1;
  const k1 = Math.ceil((to - TOL) / spacingMm) - 1;
  return Math.max(0, k1 - k0 + 1);
}

/** Rafter crossings of a row: its two ends and the rafters between; none for a row of no length. */
export function rowSupports(from: number, to: number, spacingMm: number): number {
  return to - from > TOL ? interiorRafters(from, to, spacingMm) + 2 : 0;
}

export interface StockPlan {
  /** Stock lengths to cut, before waste. */
  lengths: number;
  /** Pieces cut from an offcut of an earlier length instead of a new one. */
  pieces_from_offcuts: number;
  pieces: number;
}

/**
 * Stock lengths for a tally of pieces: longest pieces first, each from the shortest offcut that is long
 * enough (an offcut is only used for a whole piece, so the piece keeps its rafters and length rules),
 * else from a new stock length. Never fewer than ceil(total piece length ÷ stock length). Saw cuts
 * are not allowed for: battens are butt-jointed on the rafter centre line.
 */
export function planStockLengths(tally: PieceTally, stockMm: number): StockPlan {
  let shortest = 0;
  for (let mm = 1; mm <= tally.stockMm; mm++) {
    if (tally.get(mm) > 0) {
      shortest = mm;
      break;
    }
  }
  if (shortest === 0) return { lengths: 0, pieces_from_offcuts: 0, pieces: 0 };
  // Offcuts by length, ascending, with how many of each (typed arrays: no garbage per insert).
  const pool = new OffcutPool(shortest);
  let bars = 0;
  let fromOffcuts = 0;
  let pieces = 0;
  // Longest pieces first, straight from the tally.
  for (let len = tally.stockMm; len > 0; len--) {
    const count = tally.get(len);
    if (!(count > 0)) continue;
    let need = count;
    pieces += need;
    while (need > 0) {
      const lo = pool.atLeast(len);
      if (lo >= pool.size) break;
      const offcut = pool.len[lo];
      const perOffcut = Math.floor(offcut / len);
      const used = Math.min(pool.count[lo], Math.ceil(need / perOffcut));
      const placed = Math.min(need, used * perOffcut);
      pool.count[lo] -= used;
      if (pool.count[lo] === 0) pool.removeAt(lo);
      need -= placed;
      fromOffcuts += placed;
      const full = Math.floor(placed / perOffcut);
      const rest = placed - full * perOffcut;
      pool.add(offcut - perOffcut * len, full);
      if (rest > 0) pool.add(offcut - rest * len, 1);
    }
    if (need > 0) {
      const perBar = Math.floor(stockMm / len);
      const newBars = Math.ceil(need / perBar);
      bars += newBars;
      const full = Math.floor(need / perBar);
      const rest = need - full * perBar;
      pool.add(stockMm - perBar * len, full);
      if (rest > 0) pool.add(stockMm - rest * len, 1);
    }
  }
  return { lengths: bars, pieces_from_offcuts: fromOffcuts, pieces };
}

/** Offcut lengths in ascending order with their counts; lengths below the shortest piece are dropped. */
class OffcutPool {
  len = new Float64Array(64);
  count = new Float64Array(64);
  size = 0;
  constructor(private readonly shortest: number) {}

  /** Index of the first length ≥ len (size when none). */
  atLeast(len: number): number {
    let lo = 0;
    let hi = this.size;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.len[mid] < len) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }

  add(len: number, count: number) {
    if (count <= 0 || len < this.shortest) return;
    const lo = this.atLeast(len);
    if (lo < this.size && this.len[lo] === len) {
      this.count[lo] += count;
      return;
    }
    if (this.size === this.len.length) {
      const grow = (a: Float64Array) => {
        const b = new Float64Array(a.length * 2);
        b.set(a);
        return b;
      };
      this.len = grow(this.len);
      this.count = grow(this.count);
    }
    this.len.copyWithin(lo + 1, lo, this.size);
    this.count.copyWithin(lo + 1, lo, this.size);
    this.len[lo] = len;
    this.count[lo] = count;
    this.size++;
  }

  removeAt(i: number) {
    this.len.copyWithin(i, i + 1, this.size);
    this.count.copyWithin(i, i + 1, this.size);
    this.size--;
  }
}
