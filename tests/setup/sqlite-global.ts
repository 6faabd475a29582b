import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { makeSqliteTemplate } from './db-template';

/**
 * The SQLite pass of the API suite (and the browser journeys, with `seed`): one migrated database
 * made before the first test file, which createTestApp (or the journeys' server) copies for each
 * file instead of running every migration again.
 */
export function sqliteTemplateSetup(options: { seed?: boolean } = {}) {
  return async function setup(project: TestProject) {
    const dir = mkdtempSync(join(tmpdir(), 'ridgeload-template-'));
    project.provide('sqliteTemplate', await makeSqliteTemplate(join(dir, 'template.sqlite'), options));
    return () => rmSync(dir, { recursive: true, force: true });
  };
}

export default sqliteTemplateSetup();
