import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { Knex } from 'knex';

const MIGRATIONS_DIR = fileURLToPath(new URL('../../migrations', import.meta.url));

/**
 * Loads the TypeScript migrations through our own import(), so the same files run under tsx
 * (npm start) and under vitest without a separate build step.
 */
export class MigrationSource implements Knex.MigrationSource<string> {
  async getMigrations(): Promise<string[]> {
    return readdirSync(MIGRATIONS_DIR)
      .filter((f) => /^\d{14}_[a-z0-9-]+\.ts$/.test(f))
      .sort();
  }

  getMigrationName(migration: string): string {
    return migration;
  }

  async getMigration(migration: string): Promise<Knex.Migration> {
    return (await import(pathToFileURL(join(MIGRATIONS_DIR, migration)).href)) as Knex.Migration;
  }
}
