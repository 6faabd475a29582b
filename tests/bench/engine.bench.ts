/**
 * Engine benchmark: a 10,000-face job (500 houses × 20 faces of mixed shapes, with roof windows,
 * chimneys, dormer cheeks and hatches in them) through the whole pipeline (parse + check + estimate).
 * Half the houses are in single-lap tiles, a quarter slated and a quarter in plain tiles (double lap,
 * with eaves and top courses and tile-and-a-half verges; the slates with dry verges and trough valleys),
 * so the job is three schedules, each with its openings file and its own roof system. In the same run papaparse reads the same CSVs alone: as a header-row CSV usually is (the
 * ratio the target applies to), and with the schedule reader's own chunked settings (printed too); the
 * three are warmed up alike and timed interleaved, their order turned from round to round, and each
 * timed run ends with young-generation collections of its own garbage and survivors (see
 * collectOwnGarbage); the collection time inside each side's runs is printed.
 * Prints faces per second, both ratios and peak memory, and ends with one JSON line.
 * Peak memory is measured in processes of their own, each running the same warm-up and timed runs:
 * one runs only the pipeline (the target's figure), one only the bare header-row parse (for
 * comparison: its 10,000 row objects a run peak above the target by themselves, so a process doing
 * both would charge the parse's memory to the pipeline); the timing process's own peak is printed too.
 * Those processes time their runs as well, which gives the ratio a second time with each side alone,
 * run after run (two processes of each, alternated; the peak is the higher of a side's two).
 * Target: both ratios ≤ 1.5, peak RSS ≤ 120 MB. `--check` exits 1 when a target is missed.
 *
 *   npm run bench:engine [-- --check]
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { PerformanceObserver, type PerformanceEntry } from 'node:perf_hooks';
import Papa from 'papaparse';
import { runEstimateFromCsv } from '../../shared/engine/estimate';
import { parseRoofSystem } from '../../shared/engine/roof-system';
import { detectDelimiter, papaConfig } from '../../shared/engine/schedule-parse';
import type { RoofSystemInput } from '../../shared/schemas/roof-system.schema';
import { FACES_PER_HOUSE, PLAIN_TILE_LOWEST_PITCH_DEG, PLAIN_TILE_SYSTEM, SLATE_SYSTEM, generateSchedule } from './engine-job';

const HOUSES = 500;
const RUNS = 9;
const TARGET_RATIO = 1.5;
const TARGET_RSS_MB = 120;

/** The job: single-lap, slated and plain-tiled houses, each schedule with its openings and roof system. */
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

/** Start and end (performance.now(), ms) of each timed run of one side. */
type Windows = Array<[number, number]>;

/**
 * The process's CPU time (every thread: the collector's helpers too), ms, since `from`. Less moved than
 * wall time by other work on a shared machine, which takes the cores away but not the work.
 */
function cpuMsSince(from: NodeJS.CpuUsage): number {
  const used = process.cpuUsage(from);
  return (used.user + used.system) / 1000;
}

/**
 * Two young-generation collections, ending every timed run of every side inside its time: each side
 * pays for collecting the garbage it made and for what it left alive, and the next run, of whichever
 * side, starts with an empty young generation and nothing of another side's to move. The first
 * collection frees the run's garbage and copies what is still alive within the young generation; the
 * second moves those survivors to the old generation, which is where the next collection would have
 * put them, inside whichever run came next. The bare header-row parse leaves about 4.2 MB of rows
 * alive (papaparse holds them until the next full collection): with one collection a run, their move
 * to the old generation (12–21 ms, measured with --trace-gc-nvp) fell in the next side's run, so the
 * header-row parse was timed at about 22 ms, while alone in a loop of its own, as a server would run
 * it, it takes about 36 ms; the pipeline's runs leave about 0.15 MB. (A full collection is not used:
 * it shrinks the young generation, DEVELOPERS.md decision 31.) Needs node --expose-gc, which
 * `npm run bench:engine` gives.
 */
function collectOwnGarbage() {
  const gc = (globalThis as { gc?: (options: { type: 'minor' }) => void }).gc;
  if (!gc) throw new Error('run the benchmark with node --expose-gc (npm run bench:engine does)');
  gc({ type: 'minor' });
  gc({ type: 'minor' });
}

/** One timed bare parse, and the collection of its garbage, in ms. */
function timeParse(parse: (csv: string) => number, csv: string, faces: number, windows?: Windows, cpu?: number[]): number {
  const c = process.cpuUsage();
  const t = performance.now();
  const rows = parse(csv);
  collectOwnGarbage();
  const end = performance.now();
  cpu?.push(cpuMsSince(c));
  if (rows < faces) throw new Error('bare parse lost rows');
  windows?.push([t, end]);
  return end - t;
}

/**
 * One timed run of the pipeline on one schedule, in ms. The result is checked and dropped when this
 * returns, so the next run does not start while this one's result is still held (a server holds one
 * estimate per request): kept in a caller's loop, a finished result stays reachable from the loop's
 * variable until the next run has returned, and is carried into the old generation by that run's
 * collections.
 */
function timePart(part: Part): number {
  const t = performance.now();
  const out = runEstimateFromCsv(part.schedule, part.system, part.openings);
  const ms = performance.now() - t;
  if (!out.ok) throw new Error(`generated schedule rejected: ${JSON.stringify(out.errors.slice(0, 3))}`);
  if (out.result.faces.length !== part.faces) throw new Error('face count mismatch');
  if (part.doubleLap && out.result.totals.tile_and_half === 0) throw new Error('no tile-and-a-half on the double-lap houses');
  return ms;
}

/** One timed run of the whole pipeline over every schedule of the job, and the collection of its garbage, in ms. */
function timePipeline(parts: readonly Part[], windows?: Windows, cpu?: number[]): number {
  const c = process.cpuUsage();
  const t = performance.now();
  let ms = 0;
  for (const part of parts) ms += timePart(part);
  const collecting = performance.now();
  collectOwnGarbage();
  const end = performance.now();
  cpu?.push(cpuMsSince(c));
  windows?.push([t, end]);
  return ms + (end - collecting);
}

/** Garbage-collection pauses of the main thread, ms, inside each window (the closing collection included). */
function collectionsInside(entries: readonly PerformanceEntry[], windows: Windows): number[] {
  return windows.map(([from, to]) => {
    let ms = 0;
    for (const e of entries) {
      const start = Math.max(from, e.startTime);
      const end = Math.min(to, e.startTime + e.duration);
      if (end > start) ms += end - start;
    }
    return ms;
  });
}

/** A bare parse of every CSV of the job (schedules and openings files), rows seen. */
function parseAll(parse: (csv: string) => number, parts: readonly Part[]): number {
  let rows = 0;
  for (const part of parts) rows += parse(part.schedule) + parse(part.openings);
  return rows;
}

function sum(values: number[]): number {
  return values.reduce((a, b) => a + b, 0);
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Half the houses in single-lap tiles, a quarter slated, a quarter in plain tiles (steep enough for them). */
function makeJob(): Part[] {
  const part = (houses: number, seed: number, prefix: string, system: RoofSystemInput | undefined, lowestPitch = 0): Part => {
    const job = generateSchedule(houses, seed, prefix, lowestPitch);
    const parsed = parseRoofSystem(system ?? {});
    if (!parsed.ok) throw new Error(`benchmark roof system rejected: ${JSON.stringify(parsed.errors)}`);
    const doubleLap = parsed.system.tile.kind === 'double_lap';
    return { schedule: job.schedule, openings: job.openings, system, faces: houses * FACES_PER_HOUSE, openingCount: job.count, doubleLap };
  };
  return [part(HOUSES / 2, 1, 'T', undefined), part(HOUSES / 4, 2, 'S', SLATE_SYSTEM), part(HOUSES / 4, 3, 'P', PLAIN_TILE_SYSTEM, PLAIN_TILE_LOWEST_PITCH_DEG)];
}

/** Faces the engine estimated in double lap over the job, counted from its results. */
function countDoubleLapFaces(parts: readonly Part[]): number {
  let n = 0;
  for (const part of parts) {
    if (!part.doubleLap) continue;
    const out = runEstimateFromCsv(part.schedule, part.system, part.openings);
    if (!out.ok) throw new Error('generated schedule rejected');
    n += out.result.faces.length;
  }
  return n;
}

const WARM_UP = 2;
/** Processes of each side alone, alternated. */
const ALONE_ROUNDS = 2;
/**
 * Runs before the timed ones in a process of one side alone. With two, its first timed runs were still
 * two to three times slower than the rest (the pipeline: 116 and 80 ms, then 33–51 ms), the optimising
 * compiler not yet done with the code; in the timing process every side's warm-up runs before any
 * timed run.
 */
const ALONE_WARM_UP = 3 * WARM_UP;
const MEMORY_MODES = { pipeline: '--memory-of-pipeline', parse: '--memory-of-bare-parse' } as const;

function peakRssMb(): number {
  return Math.round((process.resourceUsage().maxRSS / 1024) * 10) / 10;
}

/**
 * In a process of its own: the warm-up and the timed runs of one side only, then its peak RSS and the
 * times of its timed runs (each side alone, run after run, as a server would run it: a second
 * measure of the ratio, with no other side's runs in between).
 */
function memoryRun(mode: string) {
  const parts = makeJob();
  const faces = HOUSES * FACES_PER_HOUSE;
  const times: number[] = [];
  for (let i = 0; i < ALONE_WARM_UP + RUNS; i++) {
    const ms = mode === MEMORY_MODES.pipeline ? timePipeline(parts) : timeParse((_csv: string) => parseAll(headerParse, parts), '', faces);
    if (i >= ALONE_WARM_UP) times.push(ms);
  }
  console.log(JSON.stringify({ peak_rss_mb: peakRssMb(), times_ms: times }));
}

/** Peak RSS in MB, and the times of the timed runs in ms, of this benchmark run again in one memory mode. */
function measureApart(mode: string): { peakRssMb: number; timesMs: number[] } {
  const out = spawnSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), mode], { encoding: 'utf8' });
  if (out.status !== 0) throw new Error(`memory run ${mode} failed: ${out.stderr}`);
  const lines = out.stdout.trim().split('\n');
  const last = JSON.parse(lines[lines.length - 1]) as { peak_rss_mb: number; times_ms: number[] };
  return { peakRssMb: last.peak_rss_mb, timesMs: last.times_ms };
}

async function main() {
  const parts = makeJob();
  const faces = HOUSES * FACES_PER_HOUSE;
  const openings = parts.reduce((n, p) => n + p.openingCount, 0);
  const doubleLapFaces = countDoubleLapFaces(parts);
  const csvBytes = parts.reduce((s, p) => s + p.schedule.length + p.openings.length, 0);
  const sameAll = (_csv: string) => parseAll(sameSettingsParse, parts);
  const headerAll = (_csv: string) => parseAll(headerParse, parts);
  const csv = '';

  // Warm up every path alike, so the JIT has compiled each before timing.
  for (let i = 0; i < WARM_UP; i++) {
    timeParse(headerAll, csv, faces);
    timeParse(sameAll, csv, faces);
    timePipeline(parts);
  }

  // The pipeline and both bare parses interleaved, their order turned from round to round: the header
  // parse is the ratio's denominator, so a busy moment on a shared machine, or a collection of the
  // garbage the run before left behind, falls on it and on the pipeline alike. (Timing the header parse
  // in a block of its own after the pipeline's, with one warm-up to the pipeline's two, set the two
  // sides of the ratio in different minutes of a machine whose load swings.)
  const headerMs: number[] = [];
  const sameMs: number[] = [];
  const pipelineMs: number[] = [];
  const headerCpu: number[] = [];
  const pipelineCpu: number[] = [];
  const headerRuns: Windows = [];
  const pipelineRuns: Windows = [];
  const entries: PerformanceEntry[] = [];
  const observer = new PerformanceObserver((list) => {
    entries.push(...list.getEntries());
  });
  observer.observe({ entryTypes: ['gc'] });
  for (let i = 0; i < RUNS; i++) {
    for (let k = 0; k < 3; k++) {
      const which = (i + k) % 3;
      if (which === 0) headerMs.push(timeParse(headerAll, csv, faces, headerRuns, headerCpu));
      else if (which === 1) sameMs.push(timeParse(sameAll, csv, faces));
      else pipelineMs.push(timePipeline(parts, pipelineRuns, pipelineCpu));
    }
  }
  // The observer is told of the collections once the event loop turns.
  await new Promise((resolve) => setTimeout(resolve, 50));
  observer.disconnect();
  const headerGc = collectionsInside(entries, headerRuns);
  const pipelineGc = collectionsInside(entries, pipelineRuns);

  const header = median(headerMs);
  const same = median(sameMs);
  const pipeline = median(pipelineMs);
  const round2 = (v: number) => Math.round(v * 100) / 100;
  const facesPerS = Math.round(faces / (pipeline / 1000));
  const ratio = round2(pipeline / header);
  const ratioSame = round2(pipeline / same);
  const cpuRatio = round2(median(pipelineCpu) / median(headerCpu));
  const timingRssMb = peakRssMb();
  // Each side alone, twice, alternated, so a busy minute of a shared machine falls on both sides.
  const alone = { pipeline: { peak: 0, times: [] as number[] }, parse: { peak: 0, times: [] as number[] } };
  for (let round = 0; round < ALONE_ROUNDS; round++) {
    for (const side of ['pipeline', 'parse'] as const) {
      const run = measureApart(MEMORY_MODES[side]);
      alone[side].peak = Math.max(alone[side].peak, run.peakRssMb);
      alone[side].times.push(...run.timesMs);
    }
  }
  const pipelineRssMb = alone.pipeline.peak;
  const parseRssMb = alone.parse.peak;
  const pipelineAloneMs = median(alone.pipeline.times);
  const parseAloneMs = median(alone.parse.times);
  const ratioAlone = round2(pipelineAloneMs / parseAloneMs);
  const ms = (list: number[]) => `median ${median(list).toFixed(1)} ms, fastest ${Math.min(...list).toFixed(1)} ms`;

  console.log(
    `schedule: ${faces} faces (${HOUSES} houses × ${FACES_PER_HOUSE}; ${doubleLapFaces} in double lap: slates and plain tiles), ${openings} openings, ${(csvBytes / 1024).toFixed(0)} KiB of CSV, ${RUNS} interleaved rounds`,
  );
  console.log(`papaparse alone, header row:           ${ms(headerMs)}`);
  console.log(`papaparse alone, the reader's settings: ${ms(sameMs)} (chunked, no header objects)`);
  console.log(`parse + check + estimate:              ${ms(pipelineMs)}`);
  console.log(`faces per second:                      ${facesPerS}`);
  console.log(
    `collections inside the timed runs:     header row median ${median(headerGc).toFixed(1)} ms (${sum(headerGc).toFixed(0)} ms in all), pipeline median ${median(pipelineGc).toFixed(1)} ms (${sum(pipelineGc).toFixed(0)} ms in all)`,
  );
  console.log(`CPU time per run (all threads):        header row median ${median(headerCpu).toFixed(1)} ms, pipeline median ${median(pipelineCpu).toFixed(1)} ms, ratio ${cpuRatio}`);
  console.log(`ratio to bare parse (header row):      ${ratio} (target ≤ ${TARGET_RATIO})`);
  console.log(`ratio to the reader's own bare parse:  ${ratioSame}`);
  console.log(`each side alone in a process of its own: header row median ${parseAloneMs.toFixed(1)} ms, pipeline median ${pipelineAloneMs.toFixed(1)} ms, ratio ${ratioAlone} (target ≤ ${TARGET_RATIO})`);
  console.log(`peak RSS, the pipeline's runs alone:   ${pipelineRssMb} MB (target ≤ ${TARGET_RSS_MB} MB)`);
  console.log(`peak RSS, the bare parse's runs alone: ${parseRssMb} MB`);
  console.log(`peak RSS of the timing process:        ${timingRssMb} MB (both, interleaved)`);
  const met = ratio <= TARGET_RATIO && ratioAlone <= TARGET_RATIO && pipelineRssMb <= TARGET_RSS_MB;
  console.log(met ? 'targets met' : 'TARGET MISSED');
  console.log(
    JSON.stringify({
      faces,
      openings,
      double_lap_faces: doubleLapFaces,
      faces_per_s: facesPerS,
      ratio_to_parse: ratio,
      peak_rss_mb: pipelineRssMb,
      ratio_to_same_settings_parse: ratioSame,
      ratio_each_alone: ratioAlone,
      peak_rss_bare_parse_mb: parseRssMb,
      peak_rss_timing_process_mb: timingRssMb,
      gc_ms_median_pipeline: round2(median(pipelineGc)),
      gc_ms_median_parse: round2(median(headerGc)),
      cpu_ratio_to_parse: cpuRatio,
    }),
  );
  if (!met && process.argv.includes('--check')) process.exitCode = 1;
}

const mode = process.argv[2];
if (mode === MEMORY_MODES.pipeline || mode === MEMORY_MODES.parse) memoryRun(mode);
else await main();
