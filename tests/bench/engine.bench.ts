/**
 * Engine benchmark: a 10,000-face job (500 houses × 20 faces of mixed shapes, with roof windows,
 * chimneys, dormer cheeks and hatches in them) through the whole pipeline (parse + check + estimate).
 * Half the houses are slated (double lap, with eaves and top courses and slate-and-a-half verges) and
 * half are in single-lap tiles, so the job is two schedules, each with its openings file and its own
 * roof system. In the same run papaparse reads the same CSVs alone: as a header-row CSV usually is (the
 * ratio the target applies to), and with the schedule reader's own chunked settings (printed too).
 * Prints faces per second, both ratios and peak memory, and ends with one JSON line.
 * Target: ratio ≤ 1.5, peak RSS ≤ 120 MB. `--check` exits 1 when a target is missed.
 *
 *   npm run bench:engine [-- --check]
 */
import Papa from 'papaparse';
import { runEstimateFromCsv } from '../../shared/engine/estimate';
import { detectDelimiter, papaConfig } from '../../shared/engine/schedule-parse';
import type { RoofSystemInput } from '../../shared/schemas/roof-system.schema';

const HOUSES = 500;
const FACES_PER_HOUSE = 20;
const RUNS = 9;
const TARGET_RATIO = 1.5;
const TARGET_RSS_MB = 120;

/** An invented natural slate, 500 × 250 mm (75 mm headlap from 30°, 100 mm from 22.5°). */
const SLATE_SYSTEM: RoofSystemInput = {
  tile: {
    kind: 'double_lap',
    length_mm: 500,
    width_mm: 250,
    headlap_mm: [
      { from_pitch_deg: 22.5, min_mm: 100 },
      { from_pitch_deg: 30, min_mm: 75 },
    ],
    weight_kg: 2.2,
    per_pallet: 600,
  },
  verge: { kind: 'dry' },
  valley: { kind: 'trough' },
};

/** Small seeded generator (mulberry32), so every run times the same schedule. */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A house: hipped main roof, a wing with valleys, a garage, dormers, a bay, a porch and an outbuilding. */
function generateSchedule(houses: number, seed = 1, prefix = 'H'): { schedule: string; openings: string; count: number } {
  const rand = rng(seed);
  const between = (lo: number, hi: number) => Math.round(lo + rand() * (hi - lo));
  const lines = ['building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top,ridge'];
  const openingLines = ['building,face,kind,width_mm,height_mm,quantity'];
  const cos = (deg: number) => Math.cos((deg * Math.PI) / 180);
  for (let h = 1; h <= houses; h++) {
    const b = `${prefix}${String(h).padStart(3, '0')}`;
    const rows: string[] = [];
    const add = (face: string, pitch: number, rafter: number | '', run: number | '', eaves: number, top: number | '', left: string, right: string, topKind: string) => {
      const ridge = topKind === 'abutment' ? '' : face.split(' ').slice(0, face.startsWith('Dormer') ? 2 : 1).join(' ');
      rows.push([b, face, 1, pitch, rafter, run, eaves, top, left, right, topKind, ridge].join(','));
    };
    const opening = (face: string, kind: string, width: number, height: number) => openingLines.push([b, face, kind, width, height, 1].join(','));

    // Main hipped roof: two slopes to a ridge and two hip ends, equal pitch, given by run.
    const p = between(30, 45);
    const run = between(3600, 5200);
    const length = 2 * run + between(1200, 5600);
    add('Main front', p, '', run, length, length - 2 * run, 'hip', 'hip', 'ridge');
    add('Main back', p, '', run, length, length - 2 * run, 'hip', 'hip', 'ridge');
    add('Main east', p, '', run, 2 * run, 0, 'hip', 'hip', 'ridge');
    add('Main west', p, '', run, 2 * run, 0, 'hip', 'hip', 'ridge');
    // Rear wing: a gable whose slopes widen upwards into valleys against the main roof.
    const wp = between(35, 45);
    const wrun = between(2400, 3400);
    const weaves = between(3000, 6000);
    const wrafter = Math.round(wrun / cos(wp));
    add('Wing left', wp, wrafter, wrun, weaves, weaves + wrun, 'verge', 'valley', 'ridge');
    add('Wing right', wp, wrafter, wrun, weaves, weaves + wrun, 'valley', 'verge', 'ridge');
    // Garage gable.
    const gp = between(30, 40);
    const grafter = between(2600, 3600);
    const geaves = between(5400, 7200);
    add('Garage front', gp, grafter, '', geaves, '', 'verge', 'verge', 'ridge');
    add('Garage back', gp, grafter, '', geaves, '', 'verge', 'verge', 'ridge');
    // Porch lean-to against the front wall.
    add('Porch', 25, between(1400, 2200), '', between(1800, 3200), '', 'verge', 'verge', 'abutment');
    // Two gabled dormers.
    for (const d of ['Dormer 1', 'Dormer 2']) {
      const dr = between(1300, 1900);
      const de = between(1600, 2400);
      add(`${d} left`, 45, dr, '', de, '', 'verge', 'abutment', 'ridge');
      add(`${d} right`, 45, dr, '', de, '', 'abutment', 'verge', 'ridge');
    }
    // Bay window: a hipped canopy against the wall.
    const bayRun = between(700, 1100);
    const bayRafter = Math.round(bayRun / cos(35));
    const bayEaves = 2 * bayRun + between(600, 1600);
    add('Bay front', 35, bayRafter, '', bayEaves, bayEaves - 2 * bayRun, 'hip', 'hip', 'abutment');
    add('Bay left', 35, bayRafter, '', bayRun, 0, 'abutment', 'hip', 'abutment');
    add('Bay right', 35, bayRafter, '', bayRun, 0, 'hip', 'abutment', 'abutment');
    // Outbuilding: a small hipped roof and a mono-pitch log store.
    const op = between(30, 40);
    const orun = between(1800, 2600);
    const olen = 2 * orun + between(600, 2400);
    add('Shed front', op, '', orun, olen, olen - 2 * orun, 'hip', 'hip', 'ridge');
    add('Shed back', op, '', orun, olen, olen - 2 * orun, 'hip', 'hip', 'ridge');
    add('Shed end', op, '', orun, 2 * orun, 0, 'hip', 'hip', 'ridge');
    add('Log store', 25, between(1500, 2100), '', between(2000, 3000), '', 'verge', 'verge', 'mono_ridge');
    if (rows.length !== FACES_PER_HOUSE) throw new Error(`house has ${rows.length} faces`);
    lines.push(...rows);
    // Two roof windows at the back, a chimney through the front slope, a hatch on the garage.
    opening('Main back', 'roof_window', 780, 1180);
    opening('Main back', 'roof_window', 780, 1180);
    opening('Main front', 'chimney', between(600, 1200), between(500, 900));
    opening('Garage back', 'hatch', 600, 900);
  }
  return { schedule: lines.join('\r\n') + '\r\n', openings: openingLines.join('\r\n') + '\r\n', count: openingLines.length - 1 };
}

/** The job: single-lap houses and slated houses, each schedule with its openings and roof system. */
interface Part {
  schedule: string;
  openings: string;
  system: RoofSystemInput | undefined;
  faces: number;
  openingCount: number;
  doubleLap: boolean;
}

/** papaparse alone, with the settings the schedule reader gives it (chunked, no header): rows seen. */
function sameSettingsParse(csv: string): number {
  let rows = 0;
  const config = papaConfig(
    detectDelimiter(csv),
    (results) => {
      rows += results.data.length;
    },
    csv.length,
  );
  Papa.parse<string[]>(csv, config as typeof config & Papa.ParseLocalConfig<string[], Papa.LocalFile>);
  return rows;
}

/** papaparse alone as a CSV with a header row is usually read: one object per row. */
function headerParse(csv: string): number {
  return Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true }).data.length;
}

/** One timed bare parse, in ms. */
function timeParse(parse: (csv: string) => number, csv: string, faces: number): number {
  const t = performance.now();
  const rows = parse(csv);
  const ms = performance.now() - t;
  if (rows < faces) throw new Error('bare parse lost rows');
  return ms;
}

/**
 * One timed run of the whole pipeline, in ms. The result is checked and dropped here, so the next run
 * does not start while this one's result is still held (a server holds one estimate per request).
 */
function timePipeline(parts: readonly Part[]): number {
  let ms = 0;
  for (const part of parts) {
    const t = performance.now();
    const out = runEstimateFromCsv(part.schedule, part.system, part.openings);
    ms += performance.now() - t;
    if (!out.ok) throw new Error(`generated schedule rejected: ${JSON.stringify(out.errors.slice(0, 3))}`);
    if (out.result.faces.length !== part.faces) throw new Error('face count mismatch');
    if (part.doubleLap && out.result.totals.tile_and_half === 0) throw new Error('no slate-and-a-half on the slated houses');
  }
  return ms;
}

/** A bare parse of every CSV of the job (schedules and openings files), rows seen. */
function parseAll(parse: (csv: string) => number, parts: readonly Part[]): number {
  let rows = 0;
  for (const part of parts) rows += parse(part.schedule) + parse(part.openings);
  return rows;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function main() {
  const tiled = generateSchedule(HOUSES / 2, 1, 'T');
  const slated = generateSchedule(HOUSES / 2, 2, 'S');
  const half = (HOUSES / 2) * FACES_PER_HOUSE;
  const parts: Part[] = [
    { schedule: tiled.schedule, openings: tiled.openings, system: undefined, faces: half, openingCount: tiled.count, doubleLap: false },
    { schedule: slated.schedule, openings: slated.openings, system: SLATE_SYSTEM, faces: half, openingCount: slated.count, doubleLap: true },
  ];
  const faces = HOUSES * FACES_PER_HOUSE;
  const openings = tiled.count + slated.count;
  const doubleLapFaces = half;
  const csvBytes = parts.reduce((s, p) => s + p.schedule.length + p.openings.length, 0);
  const sameAll = (_csv: string) => parseAll(sameSettingsParse, parts);
  const headerAll = (_csv: string) => parseAll(headerParse, parts);
  const csv = '';

  // Warm up every path so the JIT has compiled them before timing.
  for (let i = 0; i < 2; i++) {
    timeParse(sameAll, csv, faces);
    timePipeline(parts);
  }
  timeParse(headerAll, csv, faces);

  // The pipeline and the parse with its own settings interleaved, so a busy moment on a shared machine
  // falls on both alike; then the header-row parse, whose 10,000 row objects are its own garbage.
  const sameMs: number[] = [];
  const pipelineMs: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    sameMs.push(timeParse(sameAll, csv, faces));
    pipelineMs.push(timePipeline(parts));
  }
  const headerMs: number[] = [];
  for (let i = 0; i < RUNS; i++) headerMs.push(timeParse(headerAll, csv, faces));

  const header = median(headerMs);
  const same = median(sameMs);
  const pipeline = median(pipelineMs);
  const round2 = (v: number) => Math.round(v * 100) / 100;
  const facesPerS = Math.round(faces / (pipeline / 1000));
  const ratio = round2(pipeline / header);
  const ratioSame = round2(pipeline / same);
  const peakRssMb = Math.round((process.resourceUsage().maxRSS / 1024) * 10) / 10;
  const ms = (list: number[]) => `median ${median(list).toFixed(1)} ms, fastest ${Math.min(...list).toFixed(1)} ms`;

  console.log(
    `schedule: ${faces} faces (${HOUSES} houses × ${FACES_PER_HOUSE}; ${doubleLapFaces} slated, double lap), ${openings} openings, ${(csvBytes / 1024).toFixed(0)} KiB of CSV, ${RUNS} interleaved runs`,
  );
  console.log(`papaparse alone, header row:           ${ms(headerMs)}`);
  console.log(`papaparse alone, the reader's settings: ${ms(sameMs)} (chunked, no header objects)`);
  console.log(`parse + check + estimate:              ${ms(pipelineMs)}`);
  console.log(`faces per second:                      ${facesPerS}`);
  console.log(`ratio to bare parse (header row):      ${ratio} (target ≤ ${TARGET_RATIO})`);
  console.log(`ratio to the reader's own bare parse:  ${ratioSame}`);
  console.log(`peak RSS:                              ${peakRssMb} MB (target ≤ ${TARGET_RSS_MB} MB)`);
  const met = ratio <= TARGET_RATIO && peakRssMb <= TARGET_RSS_MB;
  console.log(met ? 'targets met' : 'TARGET MISSED');
  console.log(
    JSON.stringify({
      faces,
      openings,
      double_lap_faces: doubleLapFaces,
      faces_per_s: facesPerS,
      ratio_to_parse: ratio,
      peak_rss_mb: peakRssMb,
      ratio_to_same_settings_parse: ratioSame,
    }),
  );
  if (!met && process.argv.includes('--check')) process.exitCode = 1;
}

main();
