import type { RoofSystem } from '../schemas/roof-system.schema';
import type { Schedule } from '../schemas/schedule.schema';
import { RIDGE_BALANCE_TOLERANCE } from './defaults';
import type { BuildingFaces, JobTally } from './job-tally';
import { namedRidge, pairRidgeFaces, type RidgeBalance, type RidgeSide } from './loading';
import { Notice, warnBuilding } from './notices';
import type { EngineWarning, FaceResult } from './result';

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
 * Faces of one building grouped by the ridge they name, reused from building to building: `members`
 * holds the faces' indices group by group (each in schedule order), `start` and `count` say where each
 * group is; groups are in the order their names first appear. `guessed` counts faces naming no ridge.
 */
export interface RidgeGroups {
  members: number[];
  start: number[];
  count: number[];
  groupOf: number[];
  names: string[];
  /** Whether each group's name is plain ASCII (isPlainAscii), worked out once per group. */
  plain: boolean[];
  guessed: number;
}

export function newRidgeGroups(): RidgeGroups {
  return { members: [], start: [], count: [], groupOf: [], names: [], plain: [], guessed: 0 };
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

/** Groups a building's ridge faces by ridge name (without case) into `out`; returns the number of groups. */
function groupRidgeFaces(ridgeFaces: readonly number[], schedule: Schedule, out: RidgeGroups): number {
  const { groupOf, names, plain, count, start, members } = out;
  let groups = 0;
  let guessed = 0;
  let byKey: Map<string, number> | null = null;
  for (let k = 0; k < ridgeFaces.length; k++) {
    const ridge = schedule[ridgeFaces[k]].ridge;
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
  for (let k = 0; k < ridgeFaces.length; k++) {
    const g = groupOf[k];
    if (g < 0) continue;
    members[start[g] + count[g]++] = ridgeFaces[k];
  }
  out.guessed = guessed;
  return groups;
}

/** One building's ridge, hip and valley lengths and tiles (into the tally), its ridges and their warnings. */
export function finishBuilding(b: BuildingFaces, schedule: Schedule, faces: readonly FaceResult[], system: RoofSystem, job: JobTally, ridges: RidgeBalance[], warnings: EngineWarning[], scratch: RidgeGroups) {
  const building = b.name;
  const edges = b.edges.finish(system.ridge.cover_mm, system.hip.cover_mm);
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
  const groups = groupRidgeFaces(b.ridgeFaces, schedule, scratch);
  for (let g = 0; g < groups; g++) {
    const first = schedule[scratch.members[scratch.start[g]]];
    const name = (first.ridge as string).trim();
    const ridge = namedRidge(building, name, scratch.members, scratch.start[g], scratch.count[g], schedule, faces);
    ridges.push(ridge);
    if (scratch.count[g] === 1 && first.top_mm > 0 && first.top !== 'mono_ridge') {
      warnings.push(new Notice('unpaired_ridge_face', building, first.face, `no other face names ridge ${name}: the ridge is counted at half this face's top edge; check the schedule`));
    }
    checkBalance(warnings, building, ridge);
  }
  if (scratch.guessed === 0) return;
  const guessed: RidgeSide[] = [];
  for (const i of b.ridgeFaces) {
    const face = schedule[i];
    if (face.ridge === undefined) guessed.push({ building, face: face.face, top_mm: face.top_mm, load_kg: faces[i].load_kg });
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
