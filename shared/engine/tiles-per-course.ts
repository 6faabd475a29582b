/** Slack for lengths that are exact multiples of a cover (mm). */
const EPS = 1e-7;

export interface CoverPlay {
  min: number;
  nominal: number;
  max: number;
}
export interface OverhangRange {
  min: number;
  target: number;
  max: number;
}

export interface VergeFit {
  /** Tiles in a full course, the cut tile included when there is one. */
  tiles: number;
  /** Cover width used, mm. */
  cover_mm: number;
  /** Overhang at each verge, mm. */
  overhang_mm: number;
  /** False when no whole number of tiles fits: the course then has one cut tile. */
  fits: boolean;
}

function clamp(v: number, lo: number, hi: number): number {
  return v < lo ? lo : v > hi ? hi : v;
}

/** Scratch result of one number of gaps (module-level: the fit is computed often and allocates once). */
const trial = { ok: false, cover: 0, overhang: 0, score: 0 };

/** Tries a number of gaps between tiles within the play and the overhang range; the answer is in `trial`. */
function tryGaps(gaps: number, span: number, widthMm: number, tileWidthMm: number, cover: CoverPlay, overhang: OverhangRange) {
  trial.ok = false;
  if (gaps < 0) return;
  if (gaps === 0) {
    // A single tile covers the face with its overhangs on both sides.
    const o = (tileWidthMm - widthMm) / 2;
    if (o < overhang.min - EPS || o > overhang.max + EPS) return;
    trial.ok = true;
    trial.cover = cover.nominal;
    trial.overhang = o;
    trial.score = Math.abs(o - overhang.target);
    return;
  }
  const atTarget = span / gaps;
  let c = clamp(atTarget, cover.min, cover.max);
  let o = (gaps * c + tileWidthMm - widthMm) / 2;
  if (o < overhang.min - EPS || o > overhang.max + EPS) {
    o = clamp(o, overhang.min, overhang.max);
    c = (widthMm + 2 * o - tileWidthMm) / gaps;
    if (c < cover.min - EPS || c > cover.max + EPS) return;
  }
  trial.ok = true;
  trial.cover = c;
  trial.overhang = o;
  trial.score = Math.abs(atTarget - cover.nominal);
}

/**
 * Tiles in one course between two verges, mm throughout. n tiles span (n − 1) × cover + tile width,
 * which must equal face width + 2 × verge overhang, with the cover inside its play and the overhang
 * inside its range. Of the n that fit, the one whose cover at the target overhang is nearest the
 * nominal cover wins (the cover is spread or closed at the side lock, the overhang kept on target when
 * the play allows). When no whole n fits, the course is set out at nominal cover and target overhang
 * and one tile is cut. `out`, when given, receives the result.
 */
export function fitBetweenVerges(widthMm: number, tileWidthMm: number, cover: CoverPlay, overhang: OverhangRange, out?: VergeFit): VergeFit {
  const span = widthMm + 2 * overhang.target - tileWidthMm;
  const ideal = span / cover.nominal;
  // The feasible numbers of gaps form an interval that holds `ideal`, so if any whole number fits,
  // the whole number just below or just above `ideal` does.
  const low = Math.floor(ideal + EPS);
  tryGaps(low, span, widthMm, tileWidthMm, cover, overhang);
  let bestGaps = trial.ok ? low : -1;
  let bestCover = trial.cover;
  let bestOverhang = trial.overhang;
  const bestScore = trial.score;
  if (Math.abs(ideal - low) > EPS) {
    tryGaps(low + 1, span, widthMm, tileWidthMm, cover, overhang);
    if (trial.ok && (bestGaps < 0 || trial.score < bestScore)) {
      bestGaps = low + 1;
      bestCover = trial.cover;
      bestOverhang = trial.overhang;
    }
  }
  if (bestGaps >= 0) return fitResult(out, bestGaps + 1, bestCover, bestOverhang, true);
  return fitResult(out, Math.max(1, Math.ceil(ideal - EPS) + 1), cover.nominal, overhang.target, false);
}

function fitResult(out: VergeFit | undefined, tiles: number, coverMm: number, overhangMm: number, fits: boolean): VergeFit {
  if (!out) return { tiles, cover_mm: coverMm, overhang_mm: overhangMm, fits };
  out.tiles = tiles;
  out.cover_mm = coverMm;
  out.overhang_mm = overhangMm;
  out.fits = fits;
  return out;
}

/**
 * Tiles needed to run a course across `spanMm` (mm), the last piece showing its full width and the
 * others their cover: 0 for nothing to cover, else 1 + ceil((span − width) ÷ cover).
 */
export function tilesToSpan(spanMm: number, tileWidthMm: number, coverMm: number): number {
  if (!(spanMm > EPS)) return 0;
  if (spanMm <= tileWidthMm + EPS) return 1;
  return Math.ceil((spanMm - tileWidthMm) / coverMm - EPS) + 1;
}
