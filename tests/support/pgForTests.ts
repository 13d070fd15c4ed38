// A throwaway PostgreSQL for a test run, plus the migrated template database every test file copies.
import { mkdtempSync, rmSync, chmodSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Sequelize } from 'sequelize';
import pg from 'pg';
import { ensureDatabase, startLocalPg, type LocalPg } from '../../backend/scripts/pg';
import { createMigrator } from '../../backend/src/db/migrate';

export const TEMPLATE_DB = 'rf_template';

/** Starts a fast (fsync off) server in a temp dir and migrates the template database. */
export async function startTestPg(): Promise<{ local: LocalPg; cleanup: () => void }> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'ringfence-test-pg-'));
  chmodSync(dir, 0o755);
  const local = await startLocalPg({ dataDir: path.join(dir, 'data'), fast: true });
  await ensureDatabase(local.adminUrl, TEMPLATE_DB);
  const sequelize = new Sequelize(local.urlFor(TEMPLATE_DB), { dialect: 'postgres', dialectModule: pg, logging: false });
  await createMigrator(sequelize).up();
  await sequelize.close();
  return {
    local,
    cleanup() {
      local.stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
