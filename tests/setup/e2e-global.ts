import type { TestProject } from 'vitest/node';
import { launchBrowserServer } from './browser';
import { sqliteTemplateSetup } from './sqlite-global';

const seededTemplate = sqliteTemplateSetup({ seed: true });

/**
 * The browser journeys: one migrated and seeded demo database, copied by each journey's server, and
 * one headless Chromium that each journey file connects to (with contexts of its own), rather than
 * seeding and launching once per file.
 */
export default async function setup(project: TestProject) {
  const removeTemplate = await seededTemplate(project);
  const browser = await launchBrowserServer();
  project.provide('browserWsEndpoint', browser.wsEndpoint());
  return async () => {
    await browser.close();
    removeTemplate();
  };
}
