import { describe, expect, it } from 'vitest';
import { FACES_PER_HOUSE, PLAIN_TILE_LOWEST_PITCH_DEG, PLAIN_TILE_SYSTEM, SLATE_SYSTEM, generateSchedule } from '../../tests/bench/engine-job';
import type { RoofSystemInput } from '../schemas/roof-system.schema';
import { estimate, formatProblem, runEstimateFromCsv } from './estimate';
import { parseOpeningsCsv } from './openings-parse';
import type { EngineResult } from './result';
import { parseRoofSystem } from './roof-system';
import { parseScheduleCsv } from './schedule-parse';

/**
 * A fixed invented job (the benchmark's houses, 40 of them) held to the figures the engine gave it when
 * this test was written: a change in how the engine computes (for speed or memory) must leave every
 * figure of the result, face by face, pallet by pallet and warning by warning, as it was. A change of
 * rule changes these figures on purpose, with ENGINE_VERSION.
 */

/** FNV-1a over the result's JSON: any changed figure, name, order or field changes it. */
function fingerprint(result: EngineResult): string {
  const text = JSON.stringify(result);
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return `${text.length}:${h.toString(16)}`;
}

function run(houses: number, seed: number, prefix: string, system: RoofSystemInput | undefined, lowestPitch = 0): EngineResult {
  const job = generateSchedule(houses, seed, prefix, lowestPitch);
  const out = runEstimateFromCsv(job.schedule, system, job.openings);
  if (!out.ok) throw new Error(out.errors.map(formatProblem).join('\n'));
  expect(out.result.faces).toHaveLength(houses * FACES_PER_HOUSE);
  return out.result;
}

describe('a fixed job of 40 houses', () => {
  it('in single-lap tiles gives the same figures as before', () => {
    const r = run(20, 1, 'T', undefined);
    expect(r.totals).toMatchObject(TILED_TOTALS);
    expect(fingerprint(r)).toBe(TILED_FINGERPRINT);
  });

  it('in slate (double lap) gives the same figures as before', () => {
    const r = run(20, 2, 'S', SLATE_SYSTEM);
    expect(r.totals).toMatchObject(SLATED_TOTALS);
    expect(fingerprint(r)).toBe(SLATED_FINGERPRINT);
  });

  it("in plain tiles (double lap) gives the same figures as before, at the plain tile's gauge and lap", () => {
    const r = run(20, 3, 'P', PLAIN_TILE_SYSTEM, PLAIN_TILE_LOWEST_PITCH_DEG);
    for (const f of r.faces) {
      // NHBC Standards 7.2.19, table "Pitch, gauge and lap" (seen): plain tiles 65 mm headlap, 35° at least.
      expect(f.pitch_deg).toBeGreaterThanOrEqual(35);
      expect(f.headlap_mm).toBe(65);
      // Double lap: gauge = (length − headlap) ÷ 2 = (265 − 65) ÷ 2 = 100 mm at most (building
      // construction textbooks, "Lap and gauge for slates").
      expect(f.gauge_mm).toBeLessThanOrEqual(100);
      expect(f.half_tiles).toBe(0);
    }
    // Mortar verges and lined valleys (the defaults): no dry verge units, no trough units.
    expect(r.totals).toMatchObject(PLAIN_TOTALS);
    expect(fingerprint(r)).toBe(PLAIN_FINGERPRINT);
  });

  it('gives the same result from checked faces and openings as from the CSV files', () => {
    const job = generateSchedule(20, 2, 'S');
    const sys = parseRoofSystem(SLATE_SYSTEM);
    if (!sys.ok) throw new Error('system rejected');
    const faces = parseScheduleCsv(job.schedule, sys.system);
    if (!faces.ok) throw new Error('schedule rejected');
    const openings = parseOpeningsCsv(job.openings, faces.faces);
    if (!openings.ok) throw new Error('openings rejected');
    const direct = estimate(faces.faces, sys.system, openings.openings);
    expect(fingerprint(direct)).toBe(SLATED_FINGERPRINT);
  });
});

// Recorded from engine 1.2.0 before its memory and speed work.
const TILED_TOTALS = {
  tiles: 58110,
  tiles_order: 61016,
  half_tiles: 956,
  cut_tiles: 5772,
  batten_m: 15613.42,
  batten_lengths: 3579,
  batten_nails: 34506,
  tile_nails: 58570,
  clips: 8781,
  ridge_tiles: 1258,
  hip_tiles: 2108,
  underlay_rolls: 140,
  pallets: 339,
  weight_kg: 303395.9,
  eaves_tiles: 0,
  top_tiles: 0,
  tile_and_half: 0,
  dry_verge_units: 0,
  valley_units: 0,
};
const SLATED_TOTALS = {
  tiles: 96727,
  tiles_order: 101564,
  half_tiles: 0,
  cut_tiles: 8169,
  batten_m: 24678.18,
  batten_lengths: 5680,
  batten_nails: 54662,
  tile_nails: 221726,
  clips: 0,
  ridge_tiles: 1235,
  hip_tiles: 2085,
  underlay_rolls: 137,
  pallets: 195,
  weight_kg: 294947.6,
  eaves_tiles: 7973,
  top_tiles: 4879,
  tile_and_half: 1284,
  dry_verge_units: 3262,
  valley_units: 40,
};
// Recorded from engine 1.2.0 when the plain-tiled houses joined the benchmark.
const PLAIN_TOTALS = {
  tiles: 326775,
  tiles_order: 343114,
  half_tiles: 0,
  cut_tiles: 17986,
  batten_m: 53927.91,
  batten_lengths: 12548,
  tile_nails: 697992,
  clips: 0,
  eaves_tiles: 12131,
  top_tiles: 7108,
  tile_and_half: 2982,
  dry_verge_units: 0,
  valley_units: 0,
  ridge_end_caps: 0,
  pallets: 367,
  weight_kg: 498455.5,
};
const PLAIN_FINGERPRINT = '401306:41788a45';
const TILED_FINGERPRINT = '319087:d98435ed';
const SLATED_FINGERPRINT = '308072:43132191';
