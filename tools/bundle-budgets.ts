/**
 * What each page of the client costs to open, read from the build's manifest (vite `build.manifest`),
 * and the budgets it must keep. Pure: the caller reads the files and measures them.
 */

/** One entry of `dist/client/.vite/manifest.json` (only the fields used here). */
export interface ManifestChunk {
  file: string;
  src?: string;
  isEntry?: boolean;
  isDynamicEntry?: boolean;
  imports?: string[];
  dynamicImports?: string[];
  css?: string[];
}

export type Manifest = Record<string, ManifestChunk>;

/** The two modules src/main.tsx starts from: the sign-in page on its own, and the whole app. */
export const SIGN_IN_KEY = 'src/app/sign-in-start.tsx';
export const APP_KEY = 'src/app/app-start.tsx';

export interface Budgets {
  /** The sign-in page: the first script, everything it imports, and the sign-in page's own code. */
  signInKb: number;
  /** Any other page opened first: the first script and the page's code with all it imports. */
  routeKb: number;
  /** Any one script file. */
  chunkKb: number;
  /** Pages held to a ceiling of their own above `routeKb` (route module → kB) until they come down. */
  routeExceptions?: Record<string, number>;
}

/** What the client should keep to open in under 2 s on a site phone on 3G (DEVELOPERS.md, decision 34). */
export const TARGETS: Budgets = { signInKb: 120, routeKb: 180, chunkKb: 120 };

/**
 * Pages held to a ceiling of their own above the 180 kB target, each at its figure (rounded up) so that
 * growth fails the build. None now: every page opened first is within the target (DEVELOPERS.md,
 * decision 37). Add one only with the reason written in DEVELOPERS.md, and lower or remove it as it
 * comes down.
 */
export const ROUTE_EXCEPTIONS: Record<string, number> = {};

/**
 * The ceilings `npm test` enforces, so that growth fails the build and is a decision, not a drift: the
 * sign-in page, every page opened first and the largest file are held to their targets, but for the
 * pages named in ROUTE_EXCEPTIONS (DEVELOPERS.md, decisions 34 and 35).
 */
export const DEFAULT_BUDGETS: Budgets = { signInKb: TARGETS.signInKb, routeKb: TARGETS.routeKb, chunkKb: TARGETS.chunkKb, routeExceptions: ROUTE_EXCEPTIONS };

/** The ceiling one page is held to. */
export function routeBudget(budgets: Budgets, route: string): number {
  return budgets.routeExceptions?.[route] ?? budgets.routeKb;
}

export interface RouteCost {
  /** The page's source module (src/app/routes/x-route.tsx), or "sign-in". */
  route: string;
  /** The script files it needs before it can show, each once. */
  files: string[];
  gzipBytes: number;
}

export interface BudgetReport {
  signIn: RouteCost;
  routes: RouteCost[];
  largestChunk: { file: string; gzipBytes: number };
  failures: string[];
}

/** The files a manifest key needs loaded before it runs: itself and its static imports, transitively. */
export function staticClosure(manifest: Manifest, key: string, into = new Set<string>()): Set<string> {
  const chunk = manifest[key];
  if (!chunk) throw new Error(`The build manifest has no entry "${key}"`);
  if (into.has(chunk.file)) return into;
  into.add(chunk.file);
  for (const imported of chunk.imports ?? []) staticClosure(manifest, imported, into);
  return into;
}

/** The manifest key of the first script (the one index.html loads). */
export function entryKey(manifest: Manifest): string {
  const entries = Object.entries(manifest).filter(([, chunk]) => chunk.isEntry);
  const page = entries.find(([key]) => key === 'index.html') ?? entries[0];
  if (!page) throw new Error('The build manifest has no entry chunk');
  return page[0];
}

const kb = (bytes: number) => bytes / 1024;

/**
 * Measures the sign-in page (the first script, what index.html preloads, and the sign-in page's own
 * first script), every lazily loaded page opened first (the first script, the app's first script, the
 * page and the extra modules its loader fetches alongside, such as the cautions) and the largest file,
 * and lists every budget broken.
 */
export function checkBudgets(options: {
  manifest: Manifest;
  gzipSize: (file: string) => number;
  /** Route modules (manifest keys) and the other modules each one's loader fetches with it. */
  routeCompanions?: Record<string, string[]>;
  /** The module the first script loads for the sign-in page, when the first script does not already import it. */
  signInKey?: string;
  /** The module the first script loads for every other address (the router and the signed-in frame), counted with every page. */
  appKey?: string;
  /** Files index.html preloads whatever the address (they load with the first script on every page). */
  preloaded?: string[];
  budgets?: Budgets;
}): BudgetReport {
  const { manifest, gzipSize, routeCompanions = {}, budgets = DEFAULT_BUDGETS } = options;
  const cache = new Map<string, number>();
  const size = (file: string) => {
    let bytes = cache.get(file);
    if (bytes === undefined) {
      bytes = gzipSize(file);
      cache.set(file, bytes);
    }
    return bytes;
  };
  const costOf = (route: string, files: Set<string>): RouteCost => {
    const list = [...files].filter((file) => file.endsWith('.js'));
    return { route, files: list, gzipBytes: list.reduce((sum, file) => sum + size(file), 0) };
  };

  const entry = entryKey(manifest);
  const first = staticClosure(manifest, entry, new Set(options.preloaded ?? []));
  const signInFiles = new Set(first);
  if (options.signInKey) staticClosure(manifest, options.signInKey, signInFiles);
  const signIn = costOf('sign-in', signInFiles);
  const appFirst = new Set(first);
  if (options.appKey) staticClosure(manifest, options.appKey, appFirst);

  const routes = Object.entries(manifest)
    .filter(([key, chunk]) => chunk.isDynamicEntry && /(^|\/)src\/app\/routes\/[^/]+-route\.tsx$/.test(key))
    .map(([key]) => {
      const files = new Set(appFirst);
      staticClosure(manifest, key, files);
      for (const companion of routeCompanions[key] ?? []) staticClosure(manifest, companion, files);
      return costOf(key, files);
    })
    .sort((a, b) => b.gzipBytes - a.gzipBytes);

  const scripts = [...new Set(Object.values(manifest).map((chunk) => chunk.file))].filter((file) => file.endsWith('.js'));
  const largestChunk = scripts.map((file) => ({ file, gzipBytes: size(file) })).sort((a, b) => b.gzipBytes - a.gzipBytes)[0] ?? { file: '', gzipBytes: 0 };

  const failures: string[] = [];
  if (kb(signIn.gzipBytes) > budgets.signInKb) failures.push(`sign-in loads ${kb(signIn.gzipBytes).toFixed(1)} kB gzipped, over its ${budgets.signInKb} kB budget`);
  for (const route of routes) {
    const budget = routeBudget(budgets, route.route);
    if (kb(route.gzipBytes) > budget) failures.push(`${route.route} loads ${kb(route.gzipBytes).toFixed(1)} kB gzipped when opened first, over the ${budget} kB budget`);
  }
  for (const route of Object.keys(budgets.routeExceptions ?? {})) {
    if (!routes.some((r) => r.route === route)) failures.push(`${route} has a budget of its own but the build has no such page`);
  }
  if (kb(largestChunk.gzipBytes) > budgets.chunkKb) failures.push(`${largestChunk.file} is ${kb(largestChunk.gzipBytes).toFixed(1)} kB gzipped, over the ${budgets.chunkKb} kB budget for one file`);
  return { signIn, routes, largestChunk, failures };
}

/** The report as lines of text: each figure against its budget. */
export function formatReport(report: BudgetReport, budgets: Budgets = DEFAULT_BUDGETS, targets: Budgets = TARGETS): string[] {
  const row = (label: string, bytes: number, budget: number, target: number, files?: number) =>
    [
      `${label.padEnd(50)} ${kb(bytes).toFixed(1).padStart(7)} kB`,
      `budget ${String(budget).padStart(3)} kB`,
      `target ${String(target).padStart(3)} kB${kb(bytes) > target ? '*' : ' '}`,
      files === undefined ? '          ' : `${String(files).padStart(3)} files`,
      kb(bytes) > budget ? 'OVER' : '',
    ]
      .join('  ')
      .trimEnd();
  return [
    'JavaScript a page needs before it shows (gzipped; * over target)',
    row('sign-in (first script + sign-in page)', report.signIn.gzipBytes, budgets.signInKb, targets.signInKb, report.signIn.files.length),
    ...report.routes.map((route) => row(route.route.replace(/^src\/app\/routes\//, ''), route.gzipBytes, routeBudget(budgets, route.route), targets.routeKb, route.files.length)),
    row(`largest file: ${report.largestChunk.file.replace(/^assets\//, '')}`, report.largestChunk.gzipBytes, budgets.chunkKb, targets.chunkKb),
  ];
}
