import { describe, expect, it } from 'vitest';
import { checkBudgets, formatReport, staticClosure, TARGETS } from './bundle-budgets';
import type { Manifest } from './bundle-budgets';

// A small build: the first script with two libraries, two pages sharing a table chunk, one page with a
// lazily loaded drawing, and the cautions some pages fetch with them.
const manifest: Manifest = {
  'index.html': { file: 'assets/index.js', isEntry: true, imports: ['_react.js', '_router.js'], dynamicImports: ['src/app/routes/orders-route.tsx', 'src/app/routes/face-route.tsx'], css: ['assets/index.css'] },
  '_react.js': { file: 'assets/react.js' },
  '_router.js': { file: 'assets/router.js', imports: ['_react.js'] },
  '_table.js': { file: 'assets/table.js', imports: ['_react.js'] },
  'src/app/routes/orders-route.tsx': { file: 'assets/orders-route.js', isDynamicEntry: true, imports: ['_table.js', '_react.js'] },
  'src/app/routes/face-route.tsx': { file: 'assets/face-route.js', isDynamicEntry: true, imports: ['_table.js'], dynamicImports: ['src/drawing.tsx'] },
  'src/drawing.tsx': { file: 'assets/drawing.js', isDynamicEntry: true },
  'src/app/routes/cautions.tsx': { file: 'assets/cautions.js', isDynamicEntry: true },
};
const KB = 1024;
const sizes: Record<string, number> = {
  'assets/index.js': 20 * KB,
  'assets/react.js': 60 * KB,
  'assets/router.js': 30 * KB,
  'assets/table.js': 10 * KB,
  'assets/orders-route.js': 5 * KB,
  'assets/face-route.js': 8 * KB,
  'assets/drawing.js': 90 * KB,
  'assets/cautions.js': 2 * KB,
};
const gzipSize = (file: string) => sizes[file] ?? 0;

describe('bundle budgets from the build manifest', () => {
  it('counts a file once however many chunks import it, and follows static imports only', () => {
    expect([...staticClosure(manifest, 'src/app/routes/face-route.tsx')].sort()).toEqual(['assets/face-route.js', 'assets/react.js', 'assets/table.js']);
  });

  it('measures the sign-in page as the first script and its imports, and each page opened first on top of it', () => {
    const report = checkBudgets({ manifest, gzipSize, budgets: TARGETS, routeCompanions: { 'src/app/routes/face-route.tsx': ['src/app/routes/cautions.tsx'] } });
    expect(report.signIn.gzipBytes).toBe(110 * KB);
    expect(report.routes.map((r) => [r.route, r.gzipBytes / KB])).toEqual([
      ['src/app/routes/face-route.tsx', 130], // 110 + table 10 + page 8 + cautions 2; the drawing loads later
      ['src/app/routes/orders-route.tsx', 125],
    ]);
    expect(report.largestChunk).toEqual({ file: 'assets/drawing.js', gzipBytes: 90 * KB });
    expect(report.failures).toEqual([]);
  });

  it('fails each figure over its budget, naming it', () => {
    const report = checkBudgets({ manifest, gzipSize, budgets: { signInKb: 100, routeKb: 126, chunkKb: 80 } });
    expect(report.failures).toEqual([
      'sign-in loads 110.0 kB gzipped, over its 100 kB budget',
      'src/app/routes/face-route.tsx loads 128.0 kB gzipped when opened first, over the 126 kB budget',
      'assets/drawing.js is 90.0 kB gzipped, over the 80 kB budget for one file',
    ]);
    expect(formatReport(report, { signInKb: 100, routeKb: 126, chunkKb: 80 }).filter((line) => line.endsWith('OVER'))).toHaveLength(3);
  });

  it('holds a page named in the exceptions to its own ceiling and every other page to the route budget', () => {
    const budgets = { signInKb: 120, routeKb: 126, chunkKb: 100, routeExceptions: { 'src/app/routes/face-route.tsx': 129 } };
    const report = checkBudgets({ manifest, gzipSize, budgets });
    expect(report.failures).toEqual([]);
    expect(formatReport(report, budgets).find((line) => line.startsWith('face-route.tsx'))).toContain('budget 129 kB');
    const tighter = checkBudgets({ manifest, gzipSize, budgets: { ...budgets, routeExceptions: { 'src/app/routes/face-route.tsx': 127, 'src/app/routes/gone-route.tsx': 150 } } });
    expect(tighter.failures).toEqual([
      'src/app/routes/face-route.tsx loads 128.0 kB gzipped when opened first, over the 127 kB budget',
      'src/app/routes/gone-route.tsx has a budget of its own but the build has no such page',
    ]);
  });

  it('counts the sign-in page and the app apart when the first script loads one or the other, and what index.html preloads with both', () => {
    // The first script imports nothing; it loads the sign-in page or the app, each with what it needs.
    const split: Manifest = {
      'index.html': { file: 'assets/index.js', isEntry: true, dynamicImports: ['src/app/sign-in-start.tsx', 'src/app/app-start.tsx'] },
      '_react.js': { file: 'assets/react.js' },
      '_router.js': { file: 'assets/router.js', imports: ['_react.js'] },
      '_forms.js': { file: 'assets/forms.js', imports: ['_react.js'] },
      'src/app/sign-in-start.tsx': { file: 'assets/sign-in-start.js', isDynamicEntry: true, imports: ['_react.js', '_forms.js'] },
      'src/app/app-start.tsx': { file: 'assets/app-start.js', isDynamicEntry: true, imports: ['_react.js', '_router.js'], dynamicImports: ['src/app/routes/orders-route.tsx'] },
      'src/app/routes/orders-route.tsx': { file: 'assets/orders-route.js', isDynamicEntry: true, imports: ['_router.js'] },
      '_extra.js': { file: 'assets/extra.js' },
    };
    const splitSizes: Record<string, number> = {
      'assets/index.js': 1 * KB,
      'assets/react.js': 60 * KB,
      'assets/router.js': 30 * KB,
      'assets/forms.js': 12 * KB,
      'assets/sign-in-start.js': 4 * KB,
      'assets/app-start.js': 15 * KB,
      'assets/orders-route.js': 5 * KB,
      'assets/extra.js': 3 * KB,
    };
    const report = checkBudgets({
      manifest: split,
      gzipSize: (file) => splitSizes[file] ?? 0,
      signInKey: 'src/app/sign-in-start.tsx',
      appKey: 'src/app/app-start.tsx',
      preloaded: ['assets/extra.js'],
    });
    expect(report.signIn.gzipBytes).toBe((1 + 3 + 60 + 12 + 4) * KB); // no router, no app frame
    expect(report.routes.map((r) => [r.route, r.gzipBytes / KB])).toEqual([['src/app/routes/orders-route.tsx', 1 + 3 + 60 + 30 + 15 + 5]]); // no sign-in form
  });

  it('refuses a manifest that lacks a module it is asked about', () => {
    expect(() => checkBudgets({ manifest, gzipSize, routeCompanions: { 'src/app/routes/face-route.tsx': ['src/app/routes/missing.tsx'] } })).toThrow(/missing\.tsx/);
  });
});
