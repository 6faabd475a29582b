import { copyFileSync, existsSync } from 'node:fs';
import { inject } from 'vitest';
import { createDb, migrateLatest } from '../../server/db/knex';
import { runSeeds } from '../../server/db/seed-runner';

declare module 'vitest' {
  export interface ProvidedContext {
    /** A SQLite file with every migration run (and, in the browser journeys, the demo seeds), made once per run. */
    sqliteTemplate?: string;
  }
}

/**
 * Runs every migration (and the demo seeds when asked) on a new SQLite file and closes it, so the
 * file holds the whole database: closing the one connection checkpoints the write-ahead log into
 * it. Made once by a project's global set-up; each test file then copies it rather than migrating
 * (and seeding) a database of its own.
 */
export async function makeSqliteTemplate(file: string, options: { seed?: boolean } = {}): Promise<string> {
  const db = createDb(file);
  try {
    await migrateLatest(db);
    if (options.seed) await runSeeds(db);
  } finally {
    await db.destroy();
  }
  if (existsSync(`${file}-wal`)) throw new Error(`The template database ${file} kept its write-ahead log after closing`);
  return file;
}

/**
 * Puts a copy of the run's template database at `file` and says whether it did: false where the
 * project has no template (a test file run through another project), and the caller migrates.
 */
export function copySqliteTemplate(file: string): boolean {
  const template = inject('sqliteTemplate');
  if (!template) return false;
  copyFileSync(template, file);
  return true;
}
