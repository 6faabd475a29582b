import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { CODE_EXTENSION, SEEDS_DIR } from '../paths';
import type { Db } from './knex';

/** Runs every seed file in name order; each one is safe to run again. */
export async function runSeeds(db: Db): Promise<string[]> {
  const files = readdirSync(SEEDS_DIR)
    .filter((f) => /^\d{2}-[a-z0-9-]+\.(ts|mjs)$/.test(f) && f.endsWith(CODE_EXTENSION))
    .sort();
  for (const file of files) {
    const mod = (await import(pathToFileURL(join(SEEDS_DIR, file)).href)) as { seed: (db: Db) => Promise<void> };
    await mod.seed(db);
  }
  return files;
}

/** Seeds the demo when the database has no organisation yet (a first start). */
export async function seedDemoIfEmpty(db: Db): Promise<boolean> {
  const row = await db('organisations').count({ n: '*' }).first();
  if (Number(row?.n ?? 0) > 0) return false;
  await runSeeds(db);
  return true;
}
