import type { RoofSystem } from '../schemas/roof-system.schema';
import type { Face } from '../schemas/schedule.schema';
import { planStockLengths, type PieceTally } from './battens';
import { MAX_DELIVERY_PALLETS, SAFETY_CAUTIONS } from './defaults';
import { planDelivery } from './delivery';
import type { Scratch } from './face-courses';
import { rakingEdgeLength } from './geometry';
import type { RidgeBalance } from './loading';
import { Notice } from './notices';
import type { EngineResult, EngineWarning, FaceResult, Flashings } from './result';
import { RidgeFaces } from './ridge-groups';
import { EdgeTally } from './ridge-hip';
import { r1, r2 } from './round';
import { ENGINE_VERSION } from './version';

/** The job's running totals face by face, and its finish: orders with waste, the delivery plan and the totals. */

/**
 * Order quantity with waste: ceil(net × (1 + waste % ÷ 100)). Rounded to 1e-6 first so that 1000 at
 * 5 % gives 1050, not 1051 from floating-point noise.
 */
export function orderQuantity(net: number, wastePct: number): number {
  if (net <= 0) return 0;
  const raw = (net * (100 + wastePct)) / 100;
  return Math.ceil(Math.round(raw * 1e6) / 1e6);
}

/**
 * Running totals of a job, face by face (a face's figures times its quantity), kept in fields of one
 * object so the loop over a big schedule stays small and allocates nothing per face. Its edge tally and
 * ridge faces are the ones reused from job to job (DEVELOPERS.md, decision 40): one job at a time.
 */
export class JobTally {
  slope = 0;
  plan = 0;
  tiles = 0;
  halfTiles = 0;
  cutTiles = 0;
  eavesTiles = 0;
  topTiles = 0;
  tahTiles = 0;
  openingsArea = 0;
  roofWindows = 0;
  hatches = 0;
  flashSide = 0;
  flashTop = 0;
  flashApron = 0;
  flashBack = 0;
  vergeMm = 0;
  eavesMm = 0;
  dryVergeUnits = 0;
  /** Ridge ends at a verge, each counted by both faces of a ridge (halved at the end). */
  capEnds = 0;
  hipEdges = 0;
  valleyUnitEdges = 0;
  battenM = 0;
  battenNailCount = 0;
  tileNailCount = 0;
  clipCount = 0;
  ridgeMm = 0;
  hipMm = 0;
  valleyMm = 0;
  ridgeTiles = 0;
  hipTiles = 0;
  /** The job's buildings by number (0, 1, …), in the order they first appear; their names in `buildingNames`. */
  readonly buildings: number[] = [];
  readonly buildingNames: string[] = [];
  /** Each building's ridge, hip and valley edges, summed face by face. */
  readonly edges = EdgeTally.forJob();
  /** The faces meeting a ridge, with what their ridge needs of them, taken while each face is at hand. */
  readonly ridgeFaces = RidgeFaces.forJob();
  private readonly byBuilding = new Map<string, number>();
  private lastName: string | null = null;
  private lastBuilding = -1;
  private readonly dryVerges: boolean;
  private readonly troughValleys: boolean;
  private readonly troughCover: number;

  constructor(system: RoofSystem) {
    this.dryVerges = system.verge.kind === 'dry';
    this.troughValleys = system.valley.kind === 'trough';
    this.troughCover = system.valley.unit_length_mm - system.valley.lap_mm;
  }

  add(face: Face, f: FaceResult, scratch: Scratch, index: number) {
    const q = face.quantity;
    // Totals come from the unrounded areas and lengths, so rounding a face never shifts the job.
    this.slope += scratch.net_slope_m2 * q;
    this.plan += scratch.plan_m2 * q;
    this.tiles += f.tiles * q;
    this.halfTiles += f.half_tiles * q;
    this.cutTiles += f.cut_tiles * q;
    this.eavesTiles += f.eaves_tiles * q;
    this.topTiles += f.top_tiles * q;
    this.tahTiles += f.tile_and_half * q;
    this.openingsArea += scratch.openings_m2 * q;
    this.roofWindows += scratch.roof_windows * q;
    this.hatches += scratch.hatches * q;
    this.flashSide += scratch.flashings.side * q;
    this.flashTop += scratch.flashings.top * q;
    this.flashApron += scratch.flashings.apron * q;
    this.flashBack += scratch.flashings.back * q;
    this.battenM += (scratch.batten_mm / 1000) * q;
    this.battenNailCount += scratch.batten_nails * q;
    this.tileNailCount += scratch.tile_nails * q;
    this.clipCount += f.clips * q;

    // Fittings: a verge is square to the eaves, so its raking length is the rafter.
    const vergeEdges = (face.left === 'verge' ? 1 : 0) + (face.right === 'verge' ? 1 : 0);
    this.vergeMm += vergeEdges * face.rafter_mm * q;
    this.eavesMm += face.eaves_mm * q;
    if (this.dryVerges) {
      this.dryVergeUnits += f.courses * vergeEdges * q;
      // Both faces of a ridge see each of its ends; a mono ridge's ends are its face's alone.
      if (face.top === 'ridge') this.capEnds += vergeEdges * q;
      else if (face.top === 'mono_ridge') this.capEnds += 2 * vergeEdges * q;
    }
    this.hipEdges += ((face.left === 'hip' ? 1 : 0) + (face.right === 'hip' ? 1 : 0)) * q;
    if (this.troughValleys) {
      if (face.left === 'valley') this.valleyUnitEdges += Math.ceil(rakingEdgeLength(face.rafter_mm, scratch.inset.left) / this.troughCover - 1e-9) * q;
      if (face.right === 'valley') this.valleyUnitEdges += Math.ceil(rakingEdgeLength(face.rafter_mm, scratch.inset.right) / this.troughCover - 1e-9) * q;
    }

    const b = this.building(face.building);
    this.edges.addFace(b, q, face.rafter_mm, face.top_mm, face.top, face.left, face.right, scratch.inset.left, scratch.inset.right);
    if (face.top === 'ridge') this.ridgeFaces.add(b, index, face.top_mm, false, f.load_kg);
    else if (face.top === 'mono_ridge' && face.ridge !== undefined) this.ridgeFaces.add(b, index, face.top_mm, true, f.load_kg);
  }

  /** The building's number, in the order buildings first appear; faces of one building usually follow each other. */
  private building(name: string): number {
    if (name === this.lastName) return this.lastBuilding;
    let b = this.byBuilding.get(name);
    if (b === undefined) {
      b = this.edges.addBuilding();
      this.byBuilding.set(name, b);
      this.buildings.push(b);
      this.buildingNames.push(name);
    }
    this.lastName = name;
    this.lastBuilding = b;
    return b;
  }
}

/** Orders with waste, the delivery plan and the job's totals. */
export function finishJob(faces: FaceResult[], system: RoofSystem, tally: PieceTally, job: JobTally, ridges: RidgeBalance[], warnings: EngineWarning[]): EngineResult {
  const { slope, plan, tiles, halfTiles, cutTiles, eavesTiles, topTiles, tahTiles, openingsArea, roofWindows, hatches } = job;
  const { vergeMm, eavesMm, dryVergeUnits, capEnds, hipEdges, valleyUnitEdges, battenM, battenNailCount, tileNailCount, clipCount } = job;
  const { ridgeMm, hipMm, valleyMm, ridgeTiles, hipTiles } = job;
  const flashMm = { side: job.flashSide, top: job.flashTop, apron: job.flashApron, back: job.flashBack };
  const waste = system.waste_pct;
  const tilesOrder = orderQuantity(tiles, waste.tiles);
  const eavesOrder = orderQuantity(eavesTiles, waste.tiles);
  const topOrder = orderQuantity(topTiles, waste.tiles);
  const tahOrder = orderQuantity(tahTiles, waste.tiles);
  const stock = planStockLengths(tally, system.batten.stock_length_mm);
  // Waste on the net metres first, then one rounding; never fewer than the cutting plan needs.
  const battenLengths = Math.max(stock.lengths, orderQuantity((battenM * 1000) / system.batten.stock_length_mm, waste.battens));
  const perRollM2 = ((system.underlay.roll_width_mm - system.underlay.head_lap_mm) * system.underlay.roll_length_mm) / 1e6;
  const underlayRolls = orderQuantity(slope / perRollM2, waste.underlay);
  const ridgeOrder = orderQuantity(ridgeTiles, waste.ridge_hip);
  const hipOrder = orderQuantity(hipTiles, waste.ridge_hip);
  const ridgeEndCaps = Math.ceil(capEnds / 2);
  const hipIrons = Math.ceil(hipEdges / 2);
  const valleyUnits = Math.ceil(valleyUnitEdges / 2);

  const delivery = planDelivery(
    {
      tilesOrdered: tilesOrder,
      faces,
      withTiles: [
        { item: 'eaves_tiles', quantity: eavesOrder, unit_kg: system.tile.eaves_tile_kg },
        { item: 'top_tiles', quantity: topOrder, unit_kg: system.tile.top_tile_kg },
        { item: 'tile_and_half', quantity: tahOrder, unit_kg: system.tile.tile_and_half_kg },
      ],
      firstOff: [
        { item: 'underlay_rolls', quantity: underlayRolls, unit_kg: system.underlay.roll_kg },
        { item: 'battens', quantity: battenLengths, unit_kg: (system.batten.kg_per_m * system.batten.stock_length_mm) / 1000 },
        { item: 'batten_nails', quantity: battenNailCount, unit_kg: system.fixing.batten_nail_g / 1000 },
        { item: 'tile_nails', quantity: tileNailCount, unit_kg: system.fixing.tile_nail_g / 1000 },
        { item: 'clips', quantity: clipCount, unit_kg: system.fixing.clip_g / 1000 },
        { item: 'valley_units', quantity: valleyUnits, unit_kg: system.valley.unit_kg },
        { item: 'hip_irons', quantity: hipIrons, unit_kg: system.hip.iron_kg },
        { item: 'dry_verge_units', quantity: dryVergeUnits, unit_kg: system.verge.unit_kg },
      ],
      lastOff: [
        { item: 'ridge_tiles', quantity: ridgeOrder, unit_kg: system.ridge.weight_kg },
        { item: 'hip_tiles', quantity: hipOrder, unit_kg: system.hip.weight_kg },
        { item: 'ridge_end_caps', quantity: ridgeEndCaps, unit_kg: system.verge.end_cap_kg },
      ],
    },
    system,
    MAX_DELIVERY_PALLETS,
  );
  for (const issue of delivery.issues) warnings.push(new Notice(issue.code, null, null, issue.message));

  const flashings: Flashings = {
    side_abutment_m: r2(flashMm.side / 1000),
    top_abutment_m: r2(flashMm.top / 1000),
    apron_m: r2(flashMm.apron / 1000),
    back_gutter_m: r2(flashMm.back / 1000),
  };

  return {
    engine_version: ENGINE_VERSION,
    faces,
    totals: {
      slope_area_m2: r2(slope),
      plan_area_m2: r2(plan),
      tiles,
      tiles_order: tilesOrder,
      half_tiles: halfTiles,
      cut_tiles: cutTiles,
      batten_m: r2(battenM),
      batten_lengths: battenLengths,
      batten_nails: battenNailCount,
      tile_nails: tileNailCount,
      clips: clipCount,
      ridge_m: r2(ridgeMm / 1000),
      ridge_tiles: ridgeOrder,
      hip_m: r2(hipMm / 1000),
      hip_tiles: hipOrder,
      valley_m: r2(valleyMm / 1000),
      underlay_rolls: underlayRolls,
      pallets: delivery.tile_pallets,
      weight_kg: r1(delivery.weight_kg),
      eaves_tiles: eavesTiles,
      top_tiles: topTiles,
      tile_and_half: tahTiles,
      eaves_tiles_order: eavesOrder,
      top_tiles_order: topOrder,
      tile_and_half_order: tahOrder,
      openings_area_m2: r2(openingsArea),
      roof_windows: roofWindows,
      hatches,
      flashings,
      verge_m: r2(vergeMm / 1000),
      eaves_m: r2(eavesMm / 1000),
      dry_verge_units: dryVergeUnits,
      ridge_end_caps: ridgeEndCaps,
      hip_irons: hipIrons,
      valley_units: valleyUnits,
    },
    pallets: delivery.pallets,
    loads: delivery.loads,
    ridges,
    warnings,
    cautions: SAFETY_CAUTIONS,
  };
}
