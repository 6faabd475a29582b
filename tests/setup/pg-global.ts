import knexFactory from 'knex';
import type { TestProject } from 'vitest/node';
import { createDb, migrateLatest } from '../../server/db/knex';
import { startPgCluster } from '../../server/db/pg-cluster';

declare module 'vitest' {
  export interface ProvidedContext {
    pgAdminUrl: string;
    /** A database of the cluster with every migration run, copied (CREATE DATABASE … TEMPLATE) for each test file. */
    pgTemplate: string;
  }
}

export const PG_TEMPLATE = 'ridgeload_template';

/**
 * One PostgreSQL cluster for the PostgreSQL pass of the API suite, with one migrated database in it
 * made before the first test file; each test file makes its own database in the cluster as a copy of it.
 */
export default async function setup(project: TestProject) {
  const cluster = await startPgCluster();
  process.on('exit', () => cluster.stop());
  const admin = knexFactory({ client: 'pg', connection: cluster.adminUrl, pool: { min: 0, max: 1 } });
  try {
    await admin.raw(`CREATE DATABASE ${PG_TEMPLATE}`);
  } finally {
    await admin.destroy();
  }
  // Every connection to the template is closed before it is copied: PostgreSQL copies no database in use.
  const template = createDb(cluster.adminUrl.replace(/\/postgres$/, `/${PG_TEMPLATE}`));
  try {
    await migrateLatest(template);
  } finally {
    await template.destroy();
  }
  project.provide('pgAdminUrl', cluster.adminUrl);
  project.provide('pgTemplate', PG_TEMPLATE);
  return () => cluster.stop();
}
