import type { TestProject } from 'vitest/node';
import { startTestPg } from './pgForTests';

declare module 'vitest' {
  export interface ProvidedContext {
    pgAdminUrl: string;
  }
}

/** Reuses the run's PostgreSQL (tests/run.ts sets TEST_PG_ADMIN_URL) or starts one for this vitest run. */
export default async function setup(project: TestProject) {
  const fromRun = process.env.TEST_PG_ADMIN_URL;
  if (fromRun) {
    project.provide('pgAdminUrl', fromRun);
    return;
  }
  const { local, cleanup } = await startTestPg();
  project.provide('pgAdminUrl', local.adminUrl);
  return cleanup;
}
