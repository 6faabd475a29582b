import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { compression } from 'vite-plugin-compression2';

const apiPort = process.env.PORT ?? '3000';

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
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
