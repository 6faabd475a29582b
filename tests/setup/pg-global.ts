import type { TestProject } from 'vitest/node';
import { startPgCluster } from '../../server/db/pg-cluster';

declare module 'vitest' {
  export interface ProvidedContext {
    pgAdminUrl: string;
  }
}

/** One PostgreSQL cluster for the PostgreSQL pass of the API suite; each test file makes its own database in it. */
export default async function setup(project: TestProject) {
  const cluster = await startPgCluster();
  project.provide('pgAdminUrl', cluster.adminUrl);
  process.on('exit', () => cluster.stop());
  return () => cluster.stop();
}
