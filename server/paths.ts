import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/**
 * Where the project's folders are, whether the server runs from its TypeScript sources (tests,
 * `npm run dev`) or compiled into dist/server (npm start). The compiled server carries its migrations
 * and seeds compiled beside it; the client build is in dist/client either way.
 */
const here = dirname(fileURLToPath(import.meta.url));

function findRoot(from: string): string {
  let dir = from;
  for (;;) {
    if (existsSync(join(dir, 'package.json'))) return dir;
    const up = dirname(dir);
    if (up === dir) return from;
    dir = up;
  }
}

export const PROJECT_ROOT = findRoot(here);
/** True when this code runs compiled (an .mjs bundle), not from its .ts sources. */
export const RUNS_COMPILED = import.meta.url.endsWith('.mjs');
const codeRoot = RUNS_COMPILED ? join(PROJECT_ROOT, 'dist', 'server') : PROJECT_ROOT;

export const CLIENT_DIR = join(PROJECT_ROOT, 'dist', 'client');
export const MIGRATIONS_DIR = join(codeRoot, 'migrations');
export const SEEDS_DIR = join(codeRoot, 'seeds');
/** Migrations and seeds are .ts in the sources and .mjs once compiled. */
export const CODE_EXTENSION = RUNS_COMPILED ? '.mjs' : '.ts';
