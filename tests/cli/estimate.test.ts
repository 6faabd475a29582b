import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { build } from 'esbuild';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_SCHEDULE_CSV } from '../../shared/engine/example-schedule';

const ROOT = resolve(__dirname, '../..');
const TSX = join(ROOT, 'node_modules/.bin/tsx');
const CLI = join(ROOT, 'server/cli/estimate.ts');
const HEADER = 'building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top';

let dir = '';
let bundle = '';

function file(name: string, content: string): string {
  const path = join(dir, name);
  writeFileSync(path, content);
  return path;
}

/**
 * Runs the CLI as a child process. Most cases run it compiled once for the file (esbuild, the
 * transform tsx itself uses, bundled so each run skips tsx's start-up and per-module transforms):
 * a run then costs a tenth of the CPU, and the file runs its cases side by side. `via: 'tsx'` runs
 * it exactly as `npm run estimate` does.
 */
function run(args: string[], options: { via?: 'tsx' } = {}): Promise<{ code: number; stdout: string; stderr: string }> {
  const [command, argv] = options.via === 'tsx' ? [TSX, [CLI, ...args]] : [process.execPath, [bundle, ...args]];
  return new Promise((done) => {
    execFile(command, argv, { cwd: ROOT, maxBuffer: 64 * 1024 * 1024 }, (error, stdout, stderr) => {
      const code = error ? (typeof error.code === 'number' ? error.code : 1) : 0;
      done({ code, stdout, stderr });
    });
  });
}

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'ridgeload-cli-'));
  bundle = join(dir, 'estimate.mjs');
  await build({ entryPoints: [CLI], bundle: true, platform: 'node', format: 'esm', outfile: bundle, logLevel: 'warning' });
});
afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});

describe.concurrent('estimate CLI', () => {
  it('prints the estimate of a schedule as JSON on stdout and exits 0, with the default system', async () => {
    const r = await run(['--schedule', file('example.csv', EXAMPLE_SCHEDULE_CSV)], { via: 'tsx' });
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    const result = JSON.parse(r.stdout);
    expect(result.faces).toHaveLength(7);
    expect(result.faces[0]).toMatchObject({ building: 'Alder', face: 'Front', quantity: 12, headlap_mm: 75 });
    expect(result.totals.tiles).toBe(result.faces.reduce((s: number, f: { tiles: number; quantity: number }) => s + f.tiles * f.quantity, 0));
    expect(result.loads.length).toBeGreaterThan(0);
    expect(result.totals.clips).toBe(result.faces.reduce((s: number, f: { clips: number; quantity: number }) => s + f.clips * f.quantity, 0));
    expect(result.totals.clips).toBeGreaterThan(0);
  });

  it('uses the roof system given with --system (partial: the rest takes defaults)', async () => {
    const schedule = file('sys.csv', EXAMPLE_SCHEDULE_CSV);
    const plain = await run([`--schedule=${schedule}`]);
    const system = file('system.json', JSON.stringify({ waste_pct: { tiles: 20 }, truck: { pallet_slots: 4 } }));
    const r = await run(['--schedule', schedule, '--system', system]);
    expect(r.code).toBe(0);
    const a = JSON.parse(plain.stdout);
    const b = JSON.parse(r.stdout);
    expect(b.totals.tiles).toBe(a.totals.tiles);
    expect(b.totals.tiles_order).toBe(Math.ceil((a.totals.tiles * 120) / 100));
    expect(Math.max(...b.loads.map((l: { pallets: number[] }) => l.pallets.length))).toBe(4);
  });

  it('reads a semicolon file with decimal commas and reports unknown columns as warnings in the JSON', async () => {
    const r = await run(['--schedule', file('semi.csv', '\uFEFFface;pitch_deg;rafter_mm;eaves_mm;notes\r\nFront;37,5;4000;9000;north side\r\n')]);
    expect(r.code).toBe(0);
    const result = JSON.parse(r.stdout);
    expect(result.faces[0].pitch_deg).toBe(37.5);
    expect(result.warnings.map((w: { code: string }) => w.code)).toContain('unknown_column');
  });

  it('prints --help on stdout and exits 0', async () => {
    const r = await run(['--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/--schedule <file>/);
    expect(r.stderr).toBe('');
  });

  it.each([
    ['a negative eaves length', 'A,Front,1,35,4000,,-9000,,,,', 'row 2, column eaves_mm: must be a positive number of millimetres'],
    ['text where a number belongs', 'A,Front,1,35,long,,9000,,,,', "row 2, column rafter_mm: must be a number, not 'long'"],
    ['metres in a millimetre column', 'A,Front,1,35,4.2,,9000,,,,', 'row 2, column rafter_mm: looks like metres (4.2); give millimetres, e.g. 4200'],
    ['an unknown edge word', 'A,Front,1,35,4000,,9000,,gable,verge,ridge', "row 2, column left: unknown edge 'gable': use verge, hip, valley or abutment"],
    ['a pitch below the tile’s lowest', 'A,Front,1,15,4000,,9000,,,,', 'row 2, column pitch_deg: 15° is below the lowest pitch this tile may be laid at (22.5°)'],
    ['rafter and run that disagree', 'A,Front,1,40,5200,3900,9000,,,,', 'row 2, column run_mm: does not agree with rafter_mm'],
    ['a steep face given only by run', 'A,Front,1,82,,600,9000,,,,', 'row 2, column run_mm: give rafter_mm for faces of 80° and steeper'],
    ['a hip face without top_mm', 'A,Front,1,35,4000,,9000,,hip,hip,ridge', 'row 2, column top_mm: required on a face with a hip or valley edge'],
    ['a valley face without top_mm', 'A,Wing,1,35,4000,,9000,,verge,valley,ridge', 'row 2, column top_mm: required on a face with a hip or valley edge'],
  ])('rejects %s: nothing on stdout, the problem on stderr, exit 2', async (_name, row, message) => {
    const r = await run(['--schedule', file(`bad-${message.length}-${row.length}.csv`, `${HEADER}\n${row}\n`)]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr.startsWith(message)).toBe(true);
  });

  it('rejects a ridge named on a face against a wall: nothing on stdout, exit 2', async () => {
    const r = await run(['--schedule', file('ridge-wall.csv', `${HEADER},ridge\nA,Porch,1,25,1800,,2400,,verge,verge,abutment,Main\n`)]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toEqual(['row 2, column ridge: a face whose top is an abutment meets no ridge: leave ridge blank']);
  });

  it('lists every problem, one line each: duplicate faces and a missing column', async () => {
    const dup = await run(['--schedule', file('dup.csv', `${HEADER}\nA,Front,1,35,4000,,9000,,,,\nA,Front,1,35,4000,,9000,,,,\nA,Back,x,35,4000,,0,,,,\n`)]);
    expect(dup.code).toBe(2);
    expect(dup.stdout).toBe('');
    expect(dup.stderr.trim().split('\n')).toEqual([
      "row 3, column face: duplicate face 'Front' in building 'A' (first at row 2)",
      "row 4, column quantity: must be a number, not 'x'",
      'row 4, column eaves_mm: must be a positive number of millimetres',
    ]);
    const missing = await run(['--schedule', file('missing.csv', 'face,rafter_mm,eaves_mm\nFront,4000,9000\n')]);
    expect(missing.code).toBe(2);
    expect(missing.stderr.trim()).toBe('row 1, column pitch_deg: this required column is missing');
  });

  it('rejects a bad roof system field by its path', async () => {
    const system = file('bad-system.json', JSON.stringify({ tile: { kind: 'single_lap', length_mm: -420 } }));
    const r = await run(['--schedule', file('ok.csv', EXAMPLE_SCHEDULE_CSV), '--system', system]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/^system field tile\.length_mm: must be more than 0$/m);
  });

  it('counts clips with the clip rule given, and names a bad clip field by its path', async () => {
    const schedule = file('clips.csv', EXAMPLE_SCHEDULE_CSV);
    const none = await run(['--schedule', schedule, '--system', file('no-clips.json', JSON.stringify({ fixing: { clips: { eaves: false, verges: false } } }))]);
    expect(none.code).toBe(0);
    expect(JSON.parse(none.stdout).totals.clips).toBe(0);
    const bad = await run(['--schedule', schedule, '--system', file('bad-clips.json', JSON.stringify({ fixing: { clips: { eaves: 'yes' } } }))]);
    expect(bad.code).toBe(2);
    expect(bad.stdout).toBe('');
    expect(bad.stderr.trim()).toBe('system field fixing.clips.eaves: must be true or false');
  });

  it.each([
    [
      'a double-lap tile laid straight bond',
      { tile: { kind: 'double_lap', length_mm: 265, width_mm: 165, headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }], weight_kg: 1.1, per_pallet: 1000, bond: 'straight' } },
      'system field tile.bond: ',
    ],
    ['a pallet limit below the empty pallet', { truck: { pallet_tare_kg: 25, max_pallet_kg: 20 } }, 'system field truck.max_pallet_kg: '],
    ['a trough valley whose lap is a whole unit', { valley: { kind: 'trough', unit_length_mm: 3000, lap_mm: 3000 } }, 'system field valley.lap_mm: '],
    ['an unknown kind of verge', { verge: { kind: 'cloaked' } }, 'system field verge.kind: must be mortar or dry'],
    ['an unknown kind of valley', { valley: { kind: 'gutter' } }, 'system field valley.kind: must be lined or trough'],
  ])('rejects %s, naming the field: nothing on stdout, exit 2', async (_name, system, start) => {
    const r = await run(['--schedule', file(`sys-${start.length}.csv`, EXAMPLE_SCHEDULE_CSV), '--system', file(`sys-${start.length}.json`, JSON.stringify(system))]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr.startsWith(start)).toBe(true);
  });

  it('takes an openings file: a roof window leaves tiles out, a chimney is flashed', async () => {
    const schedule = file('open.csv', EXAMPLE_SCHEDULE_CSV);
    const plain = JSON.parse((await run(['--schedule', schedule])).stdout);
    const openings = file('openings.csv', 'building,face,kind,width_mm,height_mm,quantity\nBirch,Front,roof_window,780,1180,1\nBirch,Back,chimney,600,900,\n');
    const r = await run(['--schedule', schedule, '--openings', openings]);
    expect(r.code).toBe(0);
    const result = JSON.parse(r.stdout);
    expect(result.totals.tiles).toBeLessThan(plain.totals.tiles);
    expect(result.totals.roof_windows).toBe(8);
    expect(result.totals.flashings.back_gutter_m).toBeCloseTo(8 * 0.9, 2);
  });

  it('rejects a bad openings file, naming the file, row and column: nothing on stdout, exit 2', async () => {
    const schedule = file('open2.csv', EXAMPLE_SCHEDULE_CSV);
    const openings = file('bad-openings.csv', 'building,face,kind,width_mm,height_mm\nBirch,Front,roof_window,78000,1180\nBirch,Side,chimney,600,900\nBirch,Back,skylight,600,900\n');
    const r = await run(['--schedule', schedule, '--openings', openings]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toEqual([
      "openings file, row 2, column width_mm: 78000 mm is wider than face 'Front' (9000 mm at its widest)",
      "openings file, row 3, column face: no face 'Side' in building 'Birch' in the schedule",
      "openings file, row 4, column kind: unknown kind 'skylight': use roof_window, chimney, dormer or hatch",
    ]);
  });

  it.each([
    ['an opening taller than its face', 'Birch,Front,roof_window,780,6000,1', "openings file, row 2, column height_mm: 6000 mm is taller than face 'Front' (rafter 5091 mm)"],
    ['no opening at all', 'Birch,Front,roof_window,780,1180,0', 'openings file, row 2, column quantity: must be a whole number from 1 to 10000'],
    ['part of an opening', 'Birch,Front,roof_window,780,1180,1.5', 'openings file, row 2, column quantity: must be a whole number from 1 to 10000'],
    ['metres in an openings column', 'Birch,Front,roof_window,0.78,1180,1', 'openings file, row 2, column width_mm: looks like metres (0.78); give millimetres, e.g. 780'],
    ['a value past the last column', 'Birch,Front,roof_window,780,1180,1,9', 'openings file, row 2: has 7 values but the header has 6 columns; a value with a comma in it needs quotes'],
  ])('rejects an openings file with %s: nothing on stdout, exit 2', async (_name, row, message) => {
    const schedule = file(`open-${message.length}.csv`, EXAMPLE_SCHEDULE_CSV);
    const openings = file(`bad-open-${message.length}-${row.length}.csv`, `building,face,kind,width_mm,height_mm,quantity\n${row}\n`);
    const r = await run(['--schedule', schedule, '--openings', openings]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toEqual([message]);
  });

  it('rejects a system file that is not JSON', async () => {
    const r = await run(['--schedule', file('ok2.csv', EXAMPLE_SCHEDULE_CSV), '--system', file('broken.json', '{ tile: ')]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/^the system file '.*broken\.json' is not valid JSON: /);
  });

  it('says so when a file cannot be read', async () => {
    const r = await run(['--schedule', join(dir, 'no-such.csv')]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim()).toBe(`cannot read the schedule file '${join(dir, 'no-such.csv')}': no such file`);
  });

  it('explains its usage when --schedule is missing or an argument is unknown', async () => {
    const none = await run([]);
    expect(none.code).toBe(2);
    expect(none.stdout).toBe('');
    expect(none.stderr).toMatch(/^--schedule is required\n\nUsage:/);
    const unknown = await run(['--schedule', 'x.csv', '--fast']);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/^unknown argument '--fast'/);
    const dangling = await run(['--schedule']);
    expect(dangling.stderr).toMatch(/^--schedule needs a file name/);
  });
});
