/**
 * Engine benchmark: a 10,000-face schedule (500 houses × 20 faces of mixed shapes) through the whole
 * pipeline (parse + check + estimate), and in the same run papaparse alone on the same CSV: read as a
 * header-row CSV usually is (the ratio the target applies to), and with the schedule reader's own
 * chunked settings (printed too). Prints faces per second, both ratios and peak memory, and ends with
 * one JSON line. Target: ratio ≤ 3, peak RSS < 200 MB. `--check` exits 1 when a target is missed.
 *
 *   npm run bench:engine [-- --check]
 */
import Papa from 'papaparse';
import { runEstimateFromCsv } from '../../shared/engine/estimate';
import { detectDelimiter, papaConfig } from '../../shared/engine/schedule-parse';

const HOUSES = 500;
const FACES_PER_HOUSE = 20;
const RUNS = 9;
const TARGET_RATIO = 3;
const TARGET_RSS_MB = 200;

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
function generateSchedule(houses: number, seed = 1): string {
  const rand = rng(seed);
  const between = (lo: number, hi: number) => Math.round(lo + rand() * (hi - lo));
  const lines = ['building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top'];
  const cos = (deg: number) => Math.cos((deg * Math.PI) / 180);
  for (let h = 1; h <= houses; h++) {
    const b = `H${String(h).padStart(3, '0')}`;
    const rows: string[] = [];
    const add = (face: string, pitch: number, rafter: number | '', run: number | '', eaves: number, top: number | '', left: string, right: string, topKind: string) =>
      rows.push([b, face, 1, pitch, rafter, run, eaves, top, left, right, topKind].join(','));

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
  }
  return lines.join('\r\n') + '\r\n';
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
function timePipeline(csv: string, faces: number): number {
  const t = performance.now();
  const out = runEstimateFromCsv(csv);
  const ms = performance.now() - t;
  if (!out.ok) throw new Error(`generated schedule rejected: ${JSON.stringify(out.errors.slice(0, 3))}`);
  if (out.result.faces.length !== faces) throw new Error('face count mismatch');
  return ms;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function main() {
  const csv = generateSchedule(HOUSES);
  const faces = HOUSES * FACES_PER_HOUSE;

  // Warm up every path so the JIT has compiled them before timing.
  for (let i = 0; i < 2; i++) {
    timeParse(sameSettingsParse, csv, faces);
    timePipeline(csv, faces);
  }
  timeParse(headerParse, csv, faces);

  // The pipeline and the parse with its own settings interleaved, so a busy moment on a shared machine
  // falls on both alike; then the header-row parse, whose 10,000 row objects are its own garbage.
  const sameMs: number[] = [];
  const pipelineMs: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    sameMs.push(timeParse(sameSettingsParse, csv, faces));
    pipelineMs.push(timePipeline(csv, faces));
  }
  const headerMs: number[] = [];
  for (let i = 0; i < RUNS; i++) headerMs.push(timeParse(headerParse, csv, faces));

  const header = median(headerMs);
  const same = median(sameMs);
  const pipeline = median(pipelineMs);
  const round2 = (v: number) => Math.round(v * 100) / 100;
  const facesPerS = Math.round(faces / (pipeline / 1000));
  const ratio = round2(pipeline / header);
  const ratioSame = round2(pipeline / same);
  const peakRssMb = Math.round((process.resourceUsage().maxRSS / 1024) * 10) / 10;
  const ms = (list: number[]) => `median ${median(list).toFixed(1)} ms, fastest ${Math.min(...list).toFixed(1)} ms`;

  console.log(`schedule: ${faces} faces (${HOUSES} houses × ${FACES_PER_HOUSE}), ${(csv.length / 1024).toFixed(0)} KiB of CSV, ${RUNS} interleaved runs`);
  console.log(`papaparse alone, header row:           ${ms(headerMs)}`);
  console.log(`papaparse alone, the reader's settings: ${ms(sameMs)} (chunked, no header objects)`);
  console.log(`parse + check + estimate:              ${ms(pipelineMs)}`);
  console.log(`faces per second:                      ${facesPerS}`);
  console.log(`ratio to bare parse (header row):      ${ratio} (target ≤ ${TARGET_RATIO})`);
  console.log(`ratio to the reader's own bare parse:  ${ratioSame}`);
  console.log(`peak RSS:                              ${peakRssMb} MB (target < ${TARGET_RSS_MB} MB)`);
  const met = ratio <= TARGET_RATIO && peakRssMb < TARGET_RSS_MB;
  console.log(met ? 'targets met' : 'TARGET MISSED');
  console.log(
    JSON.stringify({ faces, faces_per_s: facesPerS, ratio_to_parse: ratio, peak_rss_mb: peakRssMb, ratio_to_same_settings_parse: ratioSame }),
  );
  if (!met && process.argv.includes('--check')) process.exitCode = 1;
}

main();
