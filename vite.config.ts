import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { compression } from 'vite-plugin-compression2';
import { VitePWA } from 'vite-plugin-pwa';

const apiPort = process.env.PORT ?? '3000';

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
    // Latin and Latin Extended cover the names on a British delivery; the other subsets load if ever used.
    globIgnores: ['**/*-vietnamese-*'],
    navigateFallback: '/index.html',
    navigateFallbackDenylist: [/^\/api\//],
    cleanupOutdatedCaches: true,
    maximumFileSizeToCacheInBytes: 3 * 1024 * 1024,
    runtimeCaching: [
      {
        urlPattern: /\/api\/(driver\/runs|auth\/me)(\?.*)?$/,
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
    react(),
    tailwindcss(),
    ...(process.env.VITEST ? [] : [pwa]),
    // Brotli and gzip copies made once at build time; the server picks one by the browser's Accept-Encoding.
    compression({ algorithms: ['brotliCompress', 'gzip'], threshold: 1024, deleteOriginalAssets: false }),
  ],
  publicDir: 'src/public',
  // One bundle for now: the app is small enough that a split would cost more round trips than it saves.
  build: { outDir: 'dist/client', emptyOutDir: true, sourcemap: true, chunkSizeWarningLimit: 900 },
  server: { proxy: { '/api': `http://localhost:${apiPort}` } },
  test: {
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['shared/**/*.test.ts', 'server/**/*.test.ts'], environment: 'node' },
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
          fileParallelism: false,
          testTimeout: 90_000,
          hookTimeout: 240_000,
        },
      },
    ],
  },
});
