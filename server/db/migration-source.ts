import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Knex } from 'knex';
import { CODE_EXTENSION, MIGRATIONS_DIR } from '../paths';

/** Migrations are recorded under their source name (.ts) whether they run from source or compiled. */
const sourceName = (file: string) => file.replace(/\.mjs$/, '.ts');

/**
 * Loads the TypeScript migrations through our own import(), so the same files run under tsx
 * (npm start) and under vitest without a separate build step.
 */
export class MigrationSource implements Knex.MigrationSource<string> {
  async getMigrations(): Promise<string[]> {
    return readdirSync(MIGRATIONS_DIR)
      .filter((f) => /^\d{14}_[a-z0-9-]+\.(ts|mjs)$/.test(f) && f.endsWith(CODE_EXTENSION))
      .sort();
  }

  getMigrationName(migration: string): string {
    return sourceName(migration);
  }

  async getMigration(migration: string): Promise<Knex.Migration> {
    return (await import(pathToFileURL(join(MIGRATIONS_DIR, migration)).href)) as Knex.Migration;
  }
}
