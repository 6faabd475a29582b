import { defineConfig } from 'vitest/config';
import type { Plugin } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { compression } from 'vite-plugin-compression2';
import { VitePWA } from 'vite-plugin-pwa';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const apiPort = process.env.PORT ?? '3000';
const CLIENT_OUT_DIR = fileURLToPath(new URL('./dist/client', import.meta.url));

/** The two ways in (src/main.tsx picks one by the address): the sign-in page alone, and the whole app. */
const SIGN_IN_START = 'src/app/sign-in-start.tsx';
const APP_START = 'src/app/app-start.tsx';

/** The app's own modules each way in needs at once (static imports), filled in when the module graph is known. */
const firstNeeds = { signIn: new Set<string>(), app: new Set<string>() };
/** The app's own modules, less the two first scripts themselves (each keeps a file of its own, named in the build manifest). */
const isOwnCode = (id: string) => /[\\/](src|shared)[\\/]/.test(id) && !id.includes('node_modules') && !id.endsWith(SIGN_IN_START) && !id.endsWith(APP_START);

/**
 * Records which of the app's own modules the sign-in page and the whole app load before they show,
 * so the chunk groups below can put each set in one file (one request each rather than many small
 * shared pieces; HTTP/1.1 opens six connections, and each extra round trip is 150 ms on 3G).
 */
function firstNeedsPlugin(): Plugin {
  return {
    name: 'ridgeload:first-needs',
    apply: 'build',
    buildEnd() {
      const staticClosure = (start: string, into: Set<string>) => {
        const stack = [start];
        while (stack.length > 0) {
          const id = stack.pop()!;
          if (into.has(id)) continue;
          into.add(id);
          for (const next of this.getModuleInfo(id)?.importedIds ?? []) stack.push(next);
        }
      };
      const ids = [...this.getModuleIds()];
      const find = (suffix: string) => {
        const id = ids.find((candidate) => candidate.replace(/\\/g, '/').endsWith(suffix));
        if (!id) throw new Error(`The build has no module ${suffix}`);
        return id;
      };
      firstNeeds.signIn.clear();
      firstNeeds.app.clear();
      staticClosure(find(SIGN_IN_START), firstNeeds.signIn);
      staticClosure(find(APP_START), firstNeeds.app);
    },
  };
}

/**
 * Libraries in chunks of their own, named and grouped by what they are, so that a change to the app's
 * code leaves their files (and every browser's copy) as they were. A library used by one kind of page
 * only (tables, drag and drop, the signature pad, CSV parsing) is loaded with the pages that use it.
 * zod's core and mini API (every shared schema is written with zod/mini) are apart from its classic
 * API and the JSON Schema code that comes with it, which no page loads any more (DEVELOPERS.md, decision 35).
 * Higher priority wins where a library's dependency is matched by more than one group.
 */
const VENDOR_CHUNKS = [
  // The bundler's and Vite's few helpers (the dynamic import's preloading) that every file uses.
  { name: 'runtime', test: /preload-helper|rolldown[\\/:]runtime/, priority: 100 },
  { name: 'react', test: /[\\/]node_modules[\\/](react|react-dom|scheduler)[\\/]/, priority: 90 },
  { name: 'router', test: /[\\/]node_modules[\\/](react-router|react-router-dom|cookie|set-cookie-parser)[\\/]/, priority: 80 },
  { name: 'query', test: /[\\/]node_modules[\\/](@tanstack[\\/](query-core|react-query|query-persist-client-core|query-async-storage-persister|react-query-persist-client)|idb-keyval)[\\/]/, priority: 70 },
  // zod's core, its mini API and the English messages every schema module asks for (shared/schemas/zod-messages.ts).
  {
    name: 'zod-core',
    test: (id: string) => /[\\/]node_modules[\\/]zod[\\/](v4[\\/](core|mini)|mini)[\\/]|[\\/]node_modules[\\/]zod[\\/]v4[\\/]locales[\\/]en\.js$/.test(id) && !/json-schema|to-json-schema/.test(id),
    priority: 65,
  },
  { name: 'zod', test: /[\\/]node_modules[\\/]zod[\\/]/, priority: 60 },
  { name: 'forms', test: /[\\/]node_modules[\\/](react-hook-form|@hookform[\\/]resolvers)[\\/]/, priority: 50 },
  { name: 'table', test: /[\\/]node_modules[\\/]@tanstack[\\/](table-core|react-table|virtual-core|react-virtual|store|react-store)[\\/]/, priority: 40 },
  { name: 'dnd', test: /[\\/]node_modules[\\/]@dnd-kit[\\/]/, priority: 40 },
  { name: 'signature', test: /[\\/]node_modules[\\/]signature_pad[\\/]/, priority: 40 },
  { name: 'csv', test: /[\\/]node_modules[\\/]papaparse[\\/]/, priority: 40 },
  // The app's own code: the sign-in form, the rest the sign-in page needs (most of it the app needs too),
  // and what only the app's frame needs. Pages loaded later import from these files rather than making
  // more small ones.
  // The form pieces (and the sign-in page's own few lines) apart, since pages without a form use the rest.
  { name: 'sign-in', test: (id: string) => isOwnCode(id) && firstNeeds.signIn.has(id) && !firstNeeds.app.has(id) && /[\\/](components[\\/]form|sign-in)/.test(id), priority: 12, includeDependenciesRecursively: false },
  { name: 'first', test: (id: string) => isOwnCode(id) && firstNeeds.signIn.has(id), priority: 11 },
  { name: 'shell', test: (id: string) => isOwnCode(id) && firstNeeds.app.has(id), priority: 10 },
];

/**
 * index.html preloads the libraries both ways in need (React, zod's core), so they arrive alongside
 * the first script rather than after it has run; the rest each way needs is preloaded by the first
 * script's own import.
 */
function preloadSharedLibraries(): Plugin {
  return {
    name: 'ridgeload:preload-shared-libraries',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler(_html, context) {
        const files = Object.values(context.bundle ?? {})
          .filter((output) => output.type === 'chunk' && ['react', 'zod-core'].includes(output.name))
          .map((output) => output.fileName);
        if (files.length !== 2) throw new Error(`Expected the react and zod-core chunks in the build, found ${files.join(', ') || 'none'}`);
        return files.map((file) => ({ tag: 'link', attrs: { rel: 'modulepreload', crossorigin: true, href: `/${file}` }, injectTo: 'head' as const }));
      },
    },
  };
}

/** The pages a driver opens without signal: their code is kept on the phone ahead of need. */
const OFFLINE_PAGES = ['src/app/routes/driver-home-route.tsx', 'src/app/routes/branches-route.tsx'];

interface ManifestChunk {
  file: string;
  isEntry?: boolean;
  imports?: string[];
  dynamicImports?: string[];
}

/**
 * Keeps in the service worker's precache only the scripts the signed-in frame and the driver's pages
 * need: the first script, the app's and the sign-in page's first scripts with their static imports, and each offline page with everything it imports,
 * at once or later (the signature pad, the face drawing). Other files (styles, fonts, index.html)
 * pass through. Read from the build's manifest, written before the service worker is generated.
 */
export function offlineScriptsOnly(entries: { url: string; size: number; revision: string | null }[]) {
  const manifest = JSON.parse(readFileSync(join(CLIENT_OUT_DIR, '.vite', 'manifest.json'), 'utf8')) as Record<string, ManifestChunk>;
  const keep = new Set<string>();
  const walk = (key: string, dynamic: boolean) => {
    const chunk = manifest[key];
    if (!chunk) throw new Error(`The build manifest has no entry "${key}" for the offline pages`);
    if (keep.has(chunk.file)) return;
    keep.add(chunk.file);
    for (const next of chunk.imports ?? []) walk(next, dynamic);
    if (dynamic) for (const next of chunk.dynamicImports ?? []) walk(next, dynamic);
  };
  for (const [key, chunk] of Object.entries(manifest)) if (chunk.isEntry) walk(key, false);
  walk(APP_START, false);
  walk(SIGN_IN_START, false);
  for (const key of OFFLINE_PAGES) walk(key, true);
  walk('src/lib/register-service-worker.ts', true);
  const manifestOut = entries.filter((entry) => !entry.url.endsWith('.js') || !entry.url.startsWith('assets/') || keep.has(entry.url));
  return { manifest: manifestOut, warnings: [] as string[] };
}

/**
 * The app on a phone without signal: Workbox precaches the app shell (scripts, styles, fonts, icons,
 * index.html), any address the app routes falls back to index.html, and the driver's day and the
 * session it needs to open are answered from the network first and from the last copy when there is
 * none. A new build waits for the person to reload (registerType prompt). Left out of the test runs.
 */
const pwa = VitePWA({
  strategies: 'generateSW',
  registerType: 'prompt',
  injectRegister: false,
  manifest: {
    name: 'Ridgeload',
    short_name: 'Ridgeload',
    description: 'Roof take-off, ordering and delivery between roofing contractors and tile merchants.',
    lang: 'en-GB',
    start_url: '/',
    scope: '/',
    display: 'standalone',
    theme_color: '#161c25',
    background_color: '#fbfaf7',
    icons: [{ src: '/favicon.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' }],
  },
  workbox: {
    globPatterns: ['**/*.{js,css,html,svg,woff2}'],
    // Scripts: the first one and the driver's pages only; the desk's and the yard's are fetched when used.
    manifestTransforms: [offlineScriptsOnly],
    // Latin and Latin Extended cover the names on a British delivery; the other subsets load if ever used.
    globIgnores: ['**/*-vietnamese-*'],
    navigateFallback: '/index.html',
    navigateFallbackDenylist: [/^\/api\//],
    cleanupOutdatedCaches: true,
    maximumFileSizeToCacheInBytes: 3 * 1024 * 1024,
    runtimeCaching: [
      {
        // Any other page's code, once fetched, stays for the next visit and for an open tab after a new
        // build has replaced it on the server. Hashed names: a copy is never stale.
        urlPattern: /\/assets\/[^/]+-[A-Za-z0-9_-]{8,}\.(js|css)$/,
        method: 'GET',
        handler: 'CacheFirst',
        options: {
          cacheName: 'ridgeload-pages',
          expiration: { maxEntries: 300, maxAgeSeconds: 60 * 24 * 60 * 60 },
          cacheableResponse: { statuses: [200] },
        },
      },
      {
        // The driver's day and who is signed in (every page asks /api/auth/session first), so the
        // phone opens the day again without signal.
        urlPattern: /\/api\/(driver\/runs|auth\/session)(\?.*)?$/,
        method: 'GET',
        handler: 'NetworkFirst',
        options: {
          cacheName: 'ridgeload-api',
          networkTimeoutSeconds: 8,
          expiration: { maxEntries: 40, maxAgeSeconds: 3 * 24 * 60 * 60 },
          cacheableResponse: { statuses: [200] },
        },
      },
    ],
  },
});

export default defineConfig({
  plugins: [
    firstNeedsPlugin(),
    preloadSharedLibraries(),
    react(),
    tailwindcss(),
    ...(process.env.VITEST ? [] : [pwa]),
    // Brotli and gzip copies made once at build time; the server picks one by the browser's Accept-Encoding.
    compression({ algorithms: ['brotliCompress', 'gzip'], threshold: 1024, deleteOriginalAssets: false }),
  ],
  publicDir: 'src/public',
  build: {
    outDir: CLIENT_OUT_DIR,
    emptyOutDir: true,
    sourcemap: true,
    // The budgets (tools/check-budgets.ts) read what each route loads from here.
    manifest: true,
    chunkSizeWarningLimit: 400,
    rolldownOptions: { output: { codeSplitting: { groups: VENDOR_CHUNKS } } },
  },
  server: { proxy: { '/api': `http://localhost:${apiPort}` } },
  test: {
    // Vitest's default on two cores is one worker (cores − 1), which leaves a core idle whenever a test
    // waits on PostgreSQL, a server process or the mail fake. The unit, ui, api and api-pg projects
    // share these workers (the browser journeys run after them, one file at a time). Two keeps both
    // cores busy (PostgreSQL and the servers tests start work while a worker waits on them) without
    // pushing slow API tests towards their time-outs.
    maxWorkers: Number(process.env.VITEST_MAX_WORKERS ?? 2),
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['shared/**/*.test.ts', 'server/**/*.test.ts', 'tools/**/*.test.ts'], environment: 'node' },
      },
      {
        extends: true,
        test: {
          name: 'ui',
          include: ['src/**/*.test.{ts,tsx}'],
          environment: 'jsdom',
          setupFiles: ['tests/setup/ui-setup.ts'],
        },
      },
      {
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts', 'tests/cli/**/*.test.ts'],
          environment: 'node',
          // Each file makes its own app on its own database (createTestApp), so the server's modules are
          // loaded once per worker rather than once per file (about 2 s of CPU each).
          isolate: false,
          globalSetup: ['tests/setup/sqlite-global.ts'],
          testTimeout: 20_000,
          hookTimeout: 30_000,
        },
      },
      {
        // The same API suite again on PostgreSQL, each test file on a database of its own in one
        // throw-away cluster.
        test: {
          name: 'api-pg',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          env: { TEST_DB: 'postgres' },
          isolate: false,
          globalSetup: ['tests/setup/pg-global.ts'],
          testTimeout: 20_000,
          hookTimeout: 30_000,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/e2e-global.ts'],
          fileParallelism: false,
          testTimeout: 90_000,
          hookTimeout: 240_000,
        },
      },
    ],
  },
});
