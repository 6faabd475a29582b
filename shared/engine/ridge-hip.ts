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
  const tally = new BuildingEdgeTally();
  for (const f of faces) tally.add(f);
  return tally.finish(ridgeCoverMm, hipCoverMm);
}

/** Running sums of one building's edges, face by face (what buildingEdges does, without keeping the faces). */
export class BuildingEdgeTally {
  // One copy's lengths for each quantity met, in the order first met (a building has one or a few).
  private readonly quantities: number[] = [];
  private readonly ridge: number[] = [];
  private readonly hip: number[] = [];
  private readonly valley: number[] = [];
  private hips = 0;
  private valleys = 0;

  add(f: EdgeFace) {
    this.addFace(f.quantity, f.rafter_mm, f.top_mm, f.top, f.left, f.right, f.inset.left, f.inset.right);
  }

  /** The same as add(), from the face's fields (the estimate adds 10,000 faces without building objects). */
  addFace(quantity: number, rafterMm: number, topMm: number, top: TopKind, left: EdgeKind, right: EdgeKind, insetLeft: number, insetRight: number) {
    // Two faces meet at a ridge, so each face brings half its top; a mono ridge is the face's alone.
    const ridge = top === 'ridge' ? topMm / 2 : top === 'mono_ridge' ? topMm : 0;
    const leftLen = left === 'hip' || left === 'valley' ? rakingEdgeLength(rafterMm, insetLeft) / 2 : 0;
    const rightLen = right === 'hip' || right === 'valley' ? rakingEdgeLength(rafterMm, insetRight) / 2 : 0;
    const hip = (left === 'hip' ? leftLen : 0) + (right === 'hip' ? rightLen : 0);
    const valley = (left === 'valley' ? leftLen : 0) + (right === 'valley' ? rightLen : 0);
    let g = this.quantities.indexOf(quantity);
    if (g < 0) {
      g = this.quantities.length;
      this.quantities.push(quantity);
      this.ridge.push(0);
      this.hip.push(0);
      this.valley.push(0);
    }
    this.ridge[g] += ridge;
    this.hip[g] += hip;
    this.valley[g] += valley;
    this.hips += (left === 'hip' ? 1 : 0) + (right === 'hip' ? 1 : 0);
    this.valleys += (left === 'valley' ? 1 : 0) + (right === 'valley' ? 1 : 0);
  }

  finish(ridgeCoverMm: number, hipCoverMm: number): BuildingEdges {
    const out: BuildingEdges = {
      ridge_mm: 0,
      hip_mm: 0,
      valley_mm: 0,
      ridge_tiles: 0,
      hip_tiles: 0,
      hip_edges: this.hips,
      valley_edges: this.valleys,
      mixed_quantity: this.quantities.length > 1,
    };
    for (let g = 0; g < this.quantities.length; g++) {
      const q = this.quantities[g];
      out.ridge_mm += this.ridge[g] * q;
      out.hip_mm += this.hip[g] * q;
      out.valley_mm += this.valley[g] * q;
      out.ridge_tiles += tilesFor(this.ridge[g], ridgeCoverMm) * q;
      out.hip_tiles += tilesFor(this.hip[g], hipCoverMm) * q;
    }
    return out;
  }
}
