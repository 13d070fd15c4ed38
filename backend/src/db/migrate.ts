import { readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';

export type MigrationFn = (ctx: { context: QueryInterface }) => Promise<void>;
export interface MigrationModule {
  up: MigrationFn;
  down: MigrationFn;
}

const dir = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');

/** Umzug over the TypeScript migration files in db/migrations (named YYYYMMDDHHMMSS-verb-noun.ts). */
export function createMigrator(sequelize: Sequelize, log = false) {
  const files = readdirSync(dir)
    .filter((f) => /^\d{14}-.+\.ts$/.test(f))
    .sort();
  return new Umzug<QueryInterface>({
    migrations: files.map((file) => ({
      name: file.replace(/\.ts$/, ''),
      up: async ({ context }) => ((await import(pathToFileURL(path.join(dir, file)).href)) as MigrationModule).up({ context }),
      down: async ({ context }) => ((await import(pathToFileURL(path.join(dir, file)).href)) as MigrationModule).down({ context }),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: log ? console : undefined,
  });
}

/** Applies every pending migration; returns their names. */
export async function migrateUp(sequelize: Sequelize, log = false): Promise<string[]> {
  const done = await createMigrator(sequelize, log).up();
  return done.map((m) => m.name);
}
