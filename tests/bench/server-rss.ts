/**
 * Resident memory of the compiled server at rest: seeds the demo data into a fresh temporary DATA_DIR
 * with the compiled database tool, starts the compiled server on it (default SQLite, local mail and
 * payment fakes, every port chosen by the system), waits, and prints its RSS and heap, and fails when a
 * package meant to load on first use is already loaded. Runs without --enable-source-maps, as
 * `npm start` does (see server/logger.ts). Builds nothing:
 * run `npm run build` first. Ends with one JSON line. Target: RSS ≤ 120 MB a minute after start.
 *
 *   npm run measure:rss                      (60 s)
 *   SERVER_RSS_AFTER_S=10 npm run measure:rss (a quick look)
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const ROOT = resolve(import.meta.dirname, '../..');
const SERVER = join(ROOT, 'dist/server/server/index.mjs');
const DB_TOOL = join(ROOT, 'dist/server/server/db/cli.mjs');
const AFTER_S = Number(process.env.SERVER_RSS_AFTER_S ?? 60);
const START_TIMEOUT_MS = 60_000;

/**
 * Packages the server needs only for some requests, or only in some set-ups, and loads on first use
 * (uploads, spreadsheets, PDFs, images, QR codes, the payment SDK, mail parsing, PostgreSQL): none
 * should be loaded in a server at rest. They are CommonJS, so Node's module cache shows them.
 */
const LOADED_ON_FIRST_USE = ['multer', 'busboy', 'exceljs', 'pdfkit', 'sharp', 'qrcode', 'stripe', 'mailparser', 'pg'];

/** Loaded into the server with --import: answers a request for process.memoryUsage() and the packages in the module cache over the IPC channel. */
const MEMORY_PROBE = `data:text/javascript,${encodeURIComponent(
  "import { createRequire } from 'node:module'; const cache = createRequire(process.cwd() + '/').cache; " +
    'const packages = () => [...new Set(Object.keys(cache).map((f) => /node_modules\\/((@[^/]+\\/)?[^/]+)/.exec(f)?.[1]).filter(Boolean))]; ' +
    "if (process.send) { process.on('message', (m) => { if (m === 'memory') process.send({ memory: process.memoryUsage(), packages: packages() }); }); process.channel?.unref(); }",
)}`;

interface Memory {
  rss: number;
  heapUsed: number;
  heapTotal: number;
  external: number;
}

const mb = (bytes: number) => Math.round((bytes / 1024 / 1024) * 10) / 10;

function procStatusKb(pid: number, field: 'VmRSS' | 'VmHWM'): number | null {
  try {
    const m = new RegExp(`^${field}:\\s+(\\d+) kB`, 'm').exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) : null;
  } catch {
    return null;
  }
}

async function main() {
  if (!Number.isFinite(AFTER_S) || AFTER_S < 0) throw new Error('SERVER_RSS_AFTER_S must be a number of seconds (0 or more)');
  for (const file of [SERVER, DB_TOOL]) {
    if (!existsSync(file)) throw new Error(`${file} is missing: run npm run build first (this script builds nothing)`);
  }
  const dataDir = mkdtempSync(join(tmpdir(), 'ridgeload-rss-'));
  const env: NodeJS.ProcessEnv = { ...process.env, NODE_ENV: 'development', DATA_DIR: dataDir, PORT: '0', HOST: '127.0.0.1', DEV_SMTP_PORT: '0', DEV_STRIPE_PORT: '0', LOG_LEVEL: 'warn' };
  delete env.DATABASE_URL;
  delete env.SMTP_URL;
  delete env.STRIPE_SECRET_KEY;
  try {
    const seeded = spawnSync(process.execPath, [DB_TOOL, 'seed'], { env, encoding: 'utf8' });
    if (seeded.status !== 0) throw new Error(`seeding the demo data failed: ${seeded.stderr || seeded.stdout}`);

    const child = spawn(process.execPath, ['--import', MEMORY_PROBE, SERVER], { env, stdio: ['ignore', 'pipe', 'pipe', 'ipc'] });
    let output = '';
    child.stdout?.on('data', (d: Buffer) => (output += d.toString()));
    child.stderr?.on('data', (d: Buffer) => (output += d.toString()));
    const exited = new Promise<number | null>((res) => child.once('exit', (code) => res(code)));
    const started = Date.now();
    while (!output.includes('Ridgeload: http')) {
      if (child.exitCode !== null) throw new Error(`the server stopped at start:\n${output}`);
      if (Date.now() - started > START_TIMEOUT_MS) throw new Error(`the server did not start within ${START_TIMEOUT_MS / 1000} s:\n${output}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    const pid = child.pid as number;
    console.log(`server started in ${((Date.now() - started) / 1000).toFixed(1)} s (pid ${pid}, data in ${dataDir}); RSS ${mb((procStatusKb(pid, 'VmRSS') ?? 0) * 1024)} MB`);
    for (let waited = 0; waited < AFTER_S;) {
      const step = Math.min(10, AFTER_S - waited);
      await new Promise((r) => setTimeout(r, step * 1000));
      waited += step;
      console.log(`after ${waited} s: RSS ${mb((procStatusKb(pid, 'VmRSS') ?? 0) * 1024)} MB`);
    }
    const { memory, packages } = await new Promise<{ memory: Memory; packages: string[] }>((res, rej) => {
      const timer = setTimeout(() => rej(new Error('the server did not answer the memory probe')), 5_000);
      child.once('message', (m: { memory: Memory; packages: string[] }) => {
        clearTimeout(timer);
        res(m);
      });
      child.send('memory');
    });
    const peakKb = procStatusKb(pid, 'VmHWM');
    child.kill('SIGTERM');
    await exited;
    console.log(`heap used ${mb(memory.heapUsed)} MB of ${mb(memory.heapTotal)} MB, external ${mb(memory.external)} MB, peak RSS since start ${peakKb === null ? '?' : mb(peakKb * 1024)} MB`);
    const loadedEarly = LOADED_ON_FIRST_USE.filter((p) => packages.includes(p));
    console.log(`${packages.length} packages loaded; of those loaded on first use: ${loadedEarly.length ? `${loadedEarly.join(', ')} — loaded at rest, NOT on first use` : 'none at rest'}`);
    console.log(`target: RSS ≤ 120 MB a minute after start — ${mb(memory.rss) <= 120 ? 'met' : 'MISSED'}`);
    console.log(JSON.stringify({ rss_mb: mb(memory.rss), heap_used_mb: mb(memory.heapUsed), after_s: AFTER_S, peak_rss_mb: peakKb === null ? null : mb(peakKb * 1024), loaded_at_rest_of_first_use: loadedEarly }));
    if (loadedEarly.length > 0) process.exitCode = 1;
  } finally {
    rmSync(dataDir, { recursive: true, force: true });
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exitCode = 1;
});
