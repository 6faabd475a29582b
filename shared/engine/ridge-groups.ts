import type { RoofSystem } from '../schemas/roof-system.schema';
import type { Schedule } from '../schemas/schedule.schema';
import { RIDGE_BALANCE_TOLERANCE } from './defaults';
import type { JobTally } from './job-tally';
import { pairRidgeFaces, type RidgeBalance, type RidgeSide } from './loading';
import { Notice, warnBuilding } from './notices';
import type { EngineWarning } from './result';
import { BuildingEdgeSums, grownF64, grownI32 } from './ridge-hip';

/** Each building's ridges, hips and valleys: faces grouped by the ridge they name, ridge loads and their warnings. */

function checkBalance(warnings: EngineWarning[], building: string, ridge: RidgeBalance) {
  let heavier = -Infinity;
  for (const kg of ridge.load_kg) if (kg > heavier) heavier = kg;
  if (heavier > 0 && ridge.difference_kg > RIDGE_BALANCE_TOLERANCE * heavier) {
    const named = ridge.ridge === null ? '' : `ridge ${ridge.ridge}: `;
    warnBuilding(
      warnings,
      building,
      'uneven_ridge_load',
      `${named}faces ${ridge.faces.join(', ')} carry ${ridge.load_kg.join(', ')} kg: load the slopes in step and finish the lighter one early, so the roof is never loaded on one side`,
    );
  }
}

/**
 * The faces of a job that meet a ridge (a ridge top, or a mono ridge that names its ridge), in schedule
 * order and chained building by building through `next`: the face's index in the schedule, its top
 * edge and its load, taken while the face is counted, so a building's ridges are put together without
 * going back to the faces' results. Flat typed arrays reused from job to job (`forJob`): no object per
 * face, nothing grown again for every job, and no reference to anything of a job.
 */
export class RidgeFaces {
  size = 0;
  next = new Int32Array(64);
  index = new Int32Array(64);
  top = new Float64Array(64);
  load = new Float64Array(64);
  /** 1 for a mono ridge, 0 for a ridge. */
  mono = new Uint8Array(64);
  /** Each building's first and last face meeting a ridge (-1: none). */
  first = new Int32Array(16);
  last = new Int32Array(16);
  private buildings = 0;

  /** The one list, emptied for a new job (an estimate runs to its end before another starts). */
  static forJob(): RidgeFaces {
    const list = RIDGE_FACES;
    list.size = 0;
    list.buildings = 0;
    return list;
  }

  add(building: number, index: number, topMm: number, mono: boolean, loadKg: number) {
    while (this.buildings <= building) {
      if (this.buildings === this.first.length) {
        this.first = grownI32(this.first, this.buildings + 1);
        this.last = grownI32(this.last, this.buildings + 1);
      }
      this.first[this.buildings] = -1;
      this.last[this.buildings] = -1;
      this.buildings++;
    }
    const k = this.size++;
    if (k === this.next.length) {
      this.next = grownI32(this.next, k + 1);
      this.index = grownI32(this.index, k + 1);
      this.top = grownF64(this.top, k + 1);
      this.load = grownF64(this.load, k + 1);
      const grown = new Uint8Array(2 * k);
      grown.set(this.mono);
      this.mono = grown;
    }
    this.next[k] = -1;
    this.index[k] = index;
    this.top[k] = topMm;
    this.load[k] = loadKg;
    this.mono[k] = mono ? 1 : 0;
    if (this.last[building] < 0) this.first[building] = k;
    else this.next[this.last[building]] = k;
    this.last[building] = k;
  }

  /** The building's first face meeting a ridge (-1: none); the next is `next[k]`. */
  firstOf(building: number): number {
    return building < this.buildings ? this.first[building] : -1;
  }
}

const RIDGE_FACES = new RidgeFaces();

/**
 * Scratch reused from building to building. A building's faces meeting a ridge (`entries`, indices
 * into RidgeFaces, with the faces' names and the ridges they name read from the schedule in one go)
 * grouped by the ridge they name: `members` holds the positions in `entries` group by group (each in
 * schedule order), `start` and `count` say where each group is; groups are in the order their names
 * first appear. `guessed` counts faces naming no ridge. `faces` and `loads` hold a ridge's faces while
 * it is put together; `edges` the building's edge sums.
 */
export interface RidgeGroups {
  entries: number[];
  faceNames: string[];
  ridgeNames: Array<string | undefined>;
  members: number[];
  start: number[];
  count: number[];
  groupOf: number[];
  names: string[];
  /** Whether each group's name is plain ASCII (isPlainAscii), worked out once per group. */
  plain: boolean[];
  guessed: number;
  faces: string[];
  loads: number[];
  edges: BuildingEdgeSums;
}

export function newRidgeGroups(): RidgeGroups {
  return { entries: [], faceNames: [], ridgeNames: [], members: [], start: [], count: [], groupOf: [], names: [], plain: [], guessed: 0, faces: [], loads: [], edges: new BuildingEdgeSums() };
}

/** True for a name of ASCII characters with no space at either end: trim() keeps it and toLowerCase() keeps its length. */
function isPlainAscii(s: string): boolean {
  const n = s.length;
  if (n === 0 || s.charCodeAt(0) <= 32 || s.charCodeAt(n - 1) <= 32) return false;
  for (let i = 0; i < n; i++) if (s.charCodeAt(i) >= 128) return false;
  return true;
}

/** a.trim().toLowerCase() === b.trim().toLowerCase(), without building the strings for plain ASCII names. */
export function sameNameWithoutCase(a: string, b: string): boolean {
  return a === b || sameName(a, isPlainAscii(a), b, isPlainAscii(b));
}

/** sameNameWithoutCase, given whether each name is plain ASCII. */
function sameName(a: string, aPlain: boolean, b: string, bPlain: boolean): boolean {
  if (a === b) return true;
  if (!aPlain || !bPlain) return a.trim().toLowerCase() === b.trim().toLowerCase();
  const n = a.length;
  if (n !== b.length) return false;
  for (let i = 0; i < n; i++) {
    let x = a.charCodeAt(i);
    let y = b.charCodeAt(i);
    if (x >= 65 && x <= 90) x += 32;
    if (y >= 65 && y <= 90) y += 32;
    if (x !== y) return false;
  }
  return true;
}

/** Past this many ridges in one building, names are found through a map instead of one by one. */
const RIDGE_GROUPS_SCANNED = 16;

/** Groups a building's `n` ridge faces (`out.ridgeNames`) by ridge name (without case) into `out`; returns the number of groups. */
function groupRidgeFaces(n: number, out: RidgeGroups): number {
  const { ridgeNames, groupOf, names, plain, count, start, members } = out;
  let groups = 0;
  let guessed = 0;
  let byKey: Map<string, number> | null = null;
  for (let k = 0; k < n; k++) {
    const ridge = ridgeNames[k];
    if (ridge === undefined) {
      groupOf[k] = -1;
      guessed++;
      continue;
    }
    let g = -1;
    const ridgePlain = isPlainAscii(ridge);
    if (byKey !== null) g = byKey.get(ridge.trim().toLowerCase()) ?? -1;
    else {
      for (let j = 0; j < groups; j++) {
        if (sameName(names[j], plain[j], ridge, ridgePlain)) {
          g = j;
          break;
        }
      }
    }
    if (g < 0) {
      g = groups++;
      names[g] = ridge;
      plain[g] = ridgePlain;
      count[g] = 0;
      if (byKey !== null) byKey.set(ridge.trim().toLowerCase(), g);
      else if (groups > RIDGE_GROUPS_SCANNED) {
        byKey = new Map();
        for (let j = 0; j < groups; j++) byKey.set(names[j].trim().toLowerCase(), j);
      }
    }
    groupOf[k] = g;
    count[g]++;
  }
  // Members group by group, each group in schedule order (a counting sort).
  let at = 0;
  for (let g = 0; g < groups; g++) {
    start[g] = at;
    at += count[g];
  }
  for (let g = 0; g < groups; g++) count[g] = 0;
  for (let k = 0; k < n; k++) {
    const g = groupOf[k];
    if (g < 0) continue;
    members[start[g] + count[g]++] = k;
  }
  out.guessed = guessed;
  return groups;
}

/**
 * One named ridge of a building: every face that meets it, in schedule order. Its load difference is
 * the heaviest less the lightest of its slopes (faces with a top edge); its hip ends (top 0), which
 * meet it at a point, are compared with each other; the larger difference is given, kg to 0.1. The
 * faces are `members[from]` … `members[from + n − 1]`, positions in the building's `entries` of `list`.
 */
function namedRidge(building: string, ridge: string, list: RidgeFaces, from: number, n: number, scratch: RidgeGroups): RidgeBalance {
  const { members, entries, faceNames, faces, loads } = scratch;
  let slopes = 0;
  let slopeLo = Infinity;
  let slopeHi = -Infinity;
  let ends = 0;
  let endLo = Infinity;
  let endHi = -Infinity;
  for (let i = 0; i < n; i++) {
    const p = members[from + i];
    const at = entries[p];
    const v = list.load[at];
    faces[i] = faceNames[p];
    loads[i] = v;
    if (list.top[at] > 0) {
      slopes++;
      if (v < slopeLo) slopeLo = v;
      if (v > slopeHi) slopeHi = v;
    } else {
      ends++;
      if (v < endLo) endLo = v;
      if (v > endHi) endHi = v;
    }
  }
  const difference = Math.max(slopes < 2 ? 0 : slopeHi - slopeLo, ends < 2 ? 0 : endHi - endLo);
  // Exact-size copies (a job holds one of these per ridge); the scratch lets go of the names.
  const names = faces.slice(0, n);
  for (let i = 0; i < n; i++) faces[i] = '';
  return new RidgeLoad(building, ridge, names, loads.slice(0, n), Math.round(difference * 10) / 10);
}

/**
 * A ridge's balance, built by a constructor rather than an object literal (DEVELOPERS.md, decision 31);
 * fields, their order and the JSON are RidgeBalance's.
 */
class RidgeLoad implements RidgeBalance {
  declare building: string;
  declare ridge: string | null;
  declare faces: string[];
  declare load_kg: number[];
  declare difference_kg: number;
  constructor(building: string, ridge: string | null, faces: string[], loads: number[], differenceKg: number) {
    this.building = building;
    this.ridge = ridge;
    this.faces = faces;
    this.load_kg = loads;
    this.difference_kg = differenceKg;
  }
}

/**
 * One building's ridge, hip and valley lengths and tiles (into the tally), its ridges and their
 * warnings, from what the tally kept of its faces (their results are not read again; of the schedule,
 * the names of the faces that meet a ridge).
 */
export function finishBuilding(b: number, schedule: Schedule, system: RoofSystem, job: JobTally, ridges: RidgeBalance[], warnings: EngineWarning[], scratch: RidgeGroups) {
  const building = job.buildingNames[b];
  const edges = job.edges.finish(b, system.ridge.cover_mm, system.hip.cover_mm, scratch.edges);
  job.ridgeMm += edges.ridge_mm;
  job.hipMm += edges.hip_mm;
  job.valleyMm += edges.valley_mm;
  job.ridgeTiles += edges.ridge_tiles;
  job.hipTiles += edges.hip_tiles;
  if (edges.hip_edges % 2 === 1) {
    warnBuilding(warnings, building, 'odd_hip_edges', `${edges.hip_edges} hip edges: a hip is shared by two faces, so one hip is counted at half its length; check the schedule`);
  }
  if (edges.valley_edges % 2 === 1) {
    warnBuilding(warnings, building, 'odd_valley_edges', `${edges.valley_edges} valley edges: a valley is shared by two faces, so one valley is counted at half its length; check the schedule`);
  }
  if (edges.mixed_quantity) {
    warnBuilding(
      warnings,
      building,
      'mixed_quantity',
      'faces of this building have different quantities: ridge and hip tiles are rounded up for each group of faces with the same quantity; check that both slopes of each ridge have the same quantity',
    );
  }
  // Faces naming their ridge are grouped by the name (without case); the others are paired by top length.
  const list = job.ridgeFaces;
  const { entries, faceNames, ridgeNames } = scratch;
  let n = 0;
  for (let k = list.firstOf(b); k >= 0; k = list.next[k]) entries[n++] = k;
  // The faces' names in one go (the faces are read one after another, not one per step of the grouping).
  for (let p = 0; p < n; p++) {
    const face = schedule[list.index[entries[p]]];
    faceNames[p] = face.face;
    ridgeNames[p] = face.ridge;
  }
  const groups = groupRidgeFaces(n, scratch);
  for (let g = 0; g < groups; g++) {
    const first = scratch.members[scratch.start[g]];
    const at = entries[first];
    const name = (ridgeNames[first] as string).trim();
    const ridge = namedRidge(building, name, list, scratch.start[g], scratch.count[g], scratch);
    ridges.push(ridge);
    if (scratch.count[g] === 1 && list.top[at] > 0 && list.mono[at] === 0) {
      warnings.push(new Notice('unpaired_ridge_face', building, faceNames[first], `no other face names ridge ${name}: the ridge is counted at half this face's top edge; check the schedule`));
    }
    checkBalance(warnings, building, ridge);
  }
  if (scratch.guessed === 0) return;
  const guessed: RidgeSide[] = [];
  for (let p = 0; p < n; p++) {
    const at = entries[p];
    if (ridgeNames[p] === undefined) guessed.push({ building, face: faceNames[p], top_mm: list.top[at], load_kg: list.load[at] });
  }
  if (guessed.length > 0) {
    warnBuilding(warnings, building, 'ridge_grouping_guessed', `${guessed.length} face(s) meeting a ridge name no ridge: they were paired by equal top length, which can hide an uneven load; give the ridge column`);
  }
  const paired = pairRidgeFaces(guessed);
  for (const pair of paired.pairs) {
    ridges.push(pair);
    checkBalance(warnings, building, pair);
  }
  for (const side of paired.unpaired) {
    if (side.top_mm === 0) continue; // a lone hip end touches the ridge at one point only
    warnings.push({
      code: 'unpaired_ridge_face',
      building,
      face: side.face,
      message: `no face with the same ridge length (${Math.round(side.top_mm)} mm) on the other slope: the ridge is counted at half this face's top edge; check the schedule`,
    });
  }
}
