import type { EdgeKind, TopKind } from '../schemas/schedule.schema';
import { rakingEdgeLength } from './geometry';

export interface EdgeFace {
  quantity: number;
  rafter_mm: number;
  top_mm: number;
  top: TopKind;
  left: EdgeKind;
  right: EdgeKind;
  inset: { left: number; right: number };
}

/** Ridge, hip and valley lengths of one face, mm, each already its share of the shared line. */
export function faceEdgeShares(f: EdgeFace): { ridge: number; hip: number; valley: number; hips: number; valleys: number } {
  // Two faces meet at a ridge, so each face brings half its top; a mono ridge is the face's alone.
  const ridge = f.top === 'ridge' ? f.top_mm / 2 : f.top === 'mono_ridge' ? f.top_mm : 0;
  const leftLen = f.left === 'hip' || f.left === 'valley' ? rakingEdgeLength(f.rafter_mm, f.inset.left) / 2 : 0;
  const rightLen = f.right === 'hip' || f.right === 'valley' ? rakingEdgeLength(f.rafter_mm, f.inset.right) / 2 : 0;
  const hip = (f.left === 'hip' ? leftLen : 0) + (f.right === 'hip' ? rightLen : 0);
  const valley = (f.left === 'valley' ? leftLen : 0) + (f.right === 'valley' ? rightLen : 0);
  const hips = (f.left === 'hip' ? 1 : 0) + (f.right === 'hip' ? 1 : 0);
  const valleys = (f.left === 'valley' ? 1 : 0) + (f.right === 'valley' ? 1 : 0);
  return { ridge, hip, valley, hips, valleys };
}

/** Tiles along a length at a cover, mm; with slack so 4200 ÷ 420 gives 10, not 11. */
function tilesFor(len: number, cover: number): number {
  return len > 0 ? Math.ceil(len / cover - 1e-9) : 0;
}

export interface BuildingEdges {
  /** Lengths over every copy of the building, mm. */
  ridge_mm: number;
  hip_mm: number;
  valley_mm: number;
  /** Ridge and hip tiles before waste, over every copy. */
  ridge_tiles: number;
  hip_tiles: number;
  /** Raking edges counted: an odd count means a hip or valley has only one of its faces listed. */
  hip_edges: number;
  valley_edges: number;
  /** True when the faces of the building have different quantities. */
  mixed_quantity: boolean;
}

/**
 * Ridge, hips and valleys of one building, mm. Ridge = (sum of top_mm of ridge faces) ÷ 2 + top_mm of
 * mono-ridge faces; each raking edge √(rafter² + inset²), halved because two faces share it. Ridge
 * tiles = ceil(ridge length ÷ ridge cover), hip tiles likewise, rounded up for one copy of the faces
 * that share a quantity and then multiplied by it: 40 houses each need their own part-used last tile,
 * and a porch on 20 of them does not change that.
 */
export function buildingEdges(faces: readonly EdgeFace[], ridgeCoverMm: number, hipCoverMm: number): BuildingEdges {
  const tally = new EdgeTally();
  const b = tally.addBuilding();
  for (const f of faces) tally.addFace(b, f.quantity, f.rafter_mm, f.top_mm, f.top, f.left, f.right, f.inset.left, f.inset.right);
  return tally.finish(b, ridgeCoverMm, hipCoverMm, new BuildingEdgeSums());
}

/** A building's edges as EdgeTally.finish writes them (a class: one is reused from building to building). */
export class BuildingEdgeSums implements BuildingEdges {
  ridge_mm = 0;
  hip_mm = 0;
  valley_mm = 0;
  ridge_tiles = 0;
  hip_tiles = 0;
  hip_edges = 0;
  valley_edges = 0;
  mixed_quantity = false;
}

/** A flat array twice as long (at least `n`), with the old one's values. */
export function grownF64(a: Float64Array, n: number) {
  const b = new Float64Array(Math.max(n, 2 * a.length));
  b.set(a);
  return b;
}

export function grownI32(a: Int32Array, n: number) {
  const b = new Int32Array(Math.max(n, 2 * a.length));
  b.set(a);
  return b;
}

/**
 * Running sums of the edges of every building of a job, face by face (what buildingEdges does, without
 * keeping the faces), in flat arrays: no objects per building. A building's sums are kept for each
 * quantity met, one copy's lengths, in the order first met (a building has one or a few): "groups",
 * chained building by building through `next`. The estimate reuses one from job to job (`forJob`), so
 * its arrays are not grown again for every job; they hold numbers only.
 */
export class EdgeTally {
  private buildings = 0;
  private firstGroup = new Int32Array(16);
  private lastGroup = new Int32Array(16);
  private hips = new Int32Array(16);
  private valleys = new Int32Array(16);
  private groups = 0;
  private quantity = new Float64Array(16);
  private ridge = new Float64Array(16);
  private hip = new Float64Array(16);
  private valley = new Float64Array(16);
  private next = new Int32Array(16);

  /** The one tally, emptied for a new job (an estimate runs to its end before another starts). */
  static forJob(): EdgeTally {
    JOB_EDGES.buildings = 0;
    JOB_EDGES.groups = 0;
    return JOB_EDGES;
  }

  /** A new building with nothing added yet; returns its number (0, 1, …). */
  addBuilding(): number {
    const b = this.buildings++;
    if (b === this.firstGroup.length) {
      this.firstGroup = grownI32(this.firstGroup, b + 1);
      this.lastGroup = grownI32(this.lastGroup, b + 1);
      this.hips = grownI32(this.hips, b + 1);
      this.valleys = grownI32(this.valleys, b + 1);
    }
    this.firstGroup[b] = -1;
    this.lastGroup[b] = -1;
    this.hips[b] = 0;
    this.valleys[b] = 0;
    return b;
  }

  /** One face of building `b`, from the face's fields (the estimate adds 10,000 faces without building objects). */
  addFace(b: number, quantity: number, rafterMm: number, topMm: number, top: TopKind, left: EdgeKind, right: EdgeKind, insetLeft: number, insetRight: number) {
    // Two faces meet at a ridge, so each face brings half its top; a mono ridge is the face's alone.
    const ridge = top === 'ridge' ? topMm / 2 : top === 'mono_ridge' ? topMm : 0;
    const leftLen = left === 'hip' || left === 'valley' ? rakingEdgeLength(rafterMm, insetLeft) / 2 : 0;
    const rightLen = right === 'hip' || right === 'valley' ? rakingEdgeLength(rafterMm, insetRight) / 2 : 0;
    const hip = (left === 'hip' ? leftLen : 0) + (right === 'hip' ? rightLen : 0);
    const valley = (left === 'valley' ? leftLen : 0) + (right === 'valley' ? rightLen : 0);
    let g = this.firstGroup[b];
    while (g >= 0 && this.quantity[g] !== quantity) g = this.next[g];
    if (g < 0) g = this.addGroup(b, quantity);
    this.ridge[g] += ridge;
    this.hip[g] += hip;
    this.valley[g] += valley;
    this.hips[b] += (left === 'hip' ? 1 : 0) + (right === 'hip' ? 1 : 0);
    this.valleys[b] += (left === 'valley' ? 1 : 0) + (right === 'valley' ? 1 : 0);
  }

  private addGroup(b: number, quantity: number): number {
    const g = this.groups++;
    if (g === this.quantity.length) {
      this.quantity = grownF64(this.quantity, g + 1);
      this.ridge = grownF64(this.ridge, g + 1);
      this.hip = grownF64(this.hip, g + 1);
      this.valley = grownF64(this.valley, g + 1);
      this.next = grownI32(this.next, g + 1);
    }
    this.quantity[g] = quantity;
    this.ridge[g] = 0;
    this.hip[g] = 0;
    this.valley[g] = 0;
    this.next[g] = -1;
    if (this.lastGroup[b] < 0) this.firstGroup[b] = g;
    else this.next[this.lastGroup[b]] = g;
    this.lastGroup[b] = g;
    return g;
  }

  /** Building `b`'s edges, written into `out` (and returned). */
  finish(b: number, ridgeCoverMm: number, hipCoverMm: number, out: BuildingEdgeSums): BuildingEdges {
    out.ridge_mm = 0;
    out.hip_mm = 0;
    out.valley_mm = 0;
    out.ridge_tiles = 0;
    out.hip_tiles = 0;
    out.hip_edges = this.hips[b];
    out.valley_edges = this.valleys[b];
    out.mixed_quantity = this.firstGroup[b] !== this.lastGroup[b];
    for (let g = this.firstGroup[b]; g >= 0; g = this.next[g]) {
      const q = this.quantity[g];
      out.ridge_mm += this.ridge[g] * q;
      out.hip_mm += this.hip[g] * q;
      out.valley_mm += this.valley[g] * q;
      out.ridge_tiles += tilesFor(this.ridge[g], ridgeCoverMm) * q;
      out.hip_tiles += tilesFor(this.hip[g], hipCoverMm) * q;
    }
    return out;
  }
}

const JOB_EDGES = new EdgeTally();
