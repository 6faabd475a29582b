/**
 * Checks the built client against its size budgets: prints each page's figure (with the budget it must
 * keep and the target it aims at) and exits non-zero when one is over budget. Run after `npm run build` (npm test does). Budgets may be tightened for a trial run:
 * BUDGET_SIGN_IN_KB, BUDGET_ROUTE_KB, BUDGET_CHUNK_KB.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import { APP_KEY, checkBudgets, DEFAULT_BUDGETS, formatReport, SIGN_IN_KEY, TARGETS } from './bundle-budgets';
import type { Budgets, Manifest } from './bundle-budgets';

const root = fileURLToPath(new URL('..', import.meta.url));
const clientDir = join(root, 'dist', 'client');
const lazyPagesFile = join(root, 'src', 'app', 'lazy-pages.tsx');

function budgetFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isFinite(value) || value <= 0) throw new Error(`${name} must be a positive number of kB, not "${raw}"`);
  return value;
}

/** Pages whose loader fetches the cautions with them (`withCaution(() => import('./routes/x-route'), …)`). */
function companionsFromLazyPages(manifest: Manifest): Record<string, string[]> {
  const source = readFileSync(lazyPagesFile, 'utf8');
  const cautionsKey = 'src/app/routes/cautions.tsx';
  const companions: Record<string, string[]> = {};
  for (const match of source.matchAll(/withCaution\(\(\) => import\('\.\/routes\/([a-z0-9-]+)'\)/g)) {
    const key = `src/app/routes/${match[1]}.tsx`;
    if (!manifest[key] || !manifest[cautionsKey]) throw new Error(`The build manifest has no entry for ${key} or ${cautionsKey}`);
    companions[key] = [cautionsKey];
  }
  return companions;
}

let manifest: Manifest;
try {
  manifest = JSON.parse(readFileSync(join(clientDir, '.vite', 'manifest.json'), 'utf8')) as Manifest;
} catch (error) {
  console.error(`No build manifest at dist/client/.vite/manifest.json: run \`npm run build\` first (${(error as Error).message})`);
  process.exit(2);
}

const budgets: Budgets = {
  signInKb: budgetFromEnv('BUDGET_SIGN_IN_KB', DEFAULT_BUDGETS.signInKb),
  routeKb: budgetFromEnv('BUDGET_ROUTE_KB', DEFAULT_BUDGETS.routeKb),
  chunkKb: budgetFromEnv('BUDGET_CHUNK_KB', DEFAULT_BUDGETS.chunkKb),
  routeExceptions: DEFAULT_BUDGETS.routeExceptions,
};
/** The scripts index.html preloads for every address (vite.config.ts adds React and zod's core). */
function preloadedByIndexHtml(): string[] {
  const html = readFileSync(join(clientDir, 'index.html'), 'utf8');
  return [...html.matchAll(/<link rel="modulepreload"[^>]*href="\/([^"]+)"/g)].map((match) => match[1]);
}

const report = checkBudgets({
  manifest,
  signInKey: SIGN_IN_KEY,
  appKey: APP_KEY,
  preloaded: preloadedByIndexHtml(),
  gzipSize: (file) => gzipSync(readFileSync(join(clientDir, file)), { level: 9 }).length,
  routeCompanions: companionsFromLazyPages(manifest),
  budgets,
});

for (const line of formatReport(report, budgets)) console.log(line);
console.log(
  JSON.stringify({
    budgets,
    targets: TARGETS,
    over_target: [report.signIn, ...report.routes].filter((r) => r.gzipBytes / 1024 > (r === report.signIn ? TARGETS.signInKb : TARGETS.routeKb)).length,
    sign_in_kb: Number((report.signIn.gzipBytes / 1024).toFixed(1)),
    largest_route: report.routes[0] ? { route: report.routes[0].route, kb: Number((report.routes[0].gzipBytes / 1024).toFixed(1)) } : null,
    largest_chunk: { file: report.largestChunk.file, kb: Number((report.largestChunk.gzipBytes / 1024).toFixed(1)) },
    failures: report.failures.length,
  }),
);
if (report.failures.length > 0) {
  for (const failure of report.failures) console.error(`Over budget: ${failure}`);
  process.exit(1);
}
