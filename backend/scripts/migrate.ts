// `npm run migrate [-- down]` against DATABASE_URL: apply pending migrations, or undo the last one.
import { loadConfig } from '../src/config';
import { createMigrator } from '../src/db/migrate';
import { createSequelize } from '../src/db/sequelize';

const config = loadConfig();
if (!config.databaseUrl) {
  console.error('Set DATABASE_URL (npm start runs migrations on its own database).');
  process.exit(1);
}
const sequelize = createSequelize(config.databaseUrl);
const migrator = createMigrator(sequelize, true);
const done = process.argv.includes('down') ? await migrator.down() : await migrator.up();
console.log(`${done.length} migration(s) ${process.argv.includes('down') ? 'undone' : 'applied'}.`);
await sequelize.close();
