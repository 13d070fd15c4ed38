// `npm start`: local PostgreSQL (unless DATABASE_URL), migrate, seed the demo when empty, build the
// client when it is missing or stale, then serve on http://127.0.0.1:3000 (PORT overrides).
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadConfig } from '../src/config';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../src/db/seed';
import { startServer } from '../src/server';
import { buildClientIfNeeded } from './clientBuild';
import { ensureDatabase, PgSetupError, resolveDataDir, startLocalPg, type LocalPg } from './pg';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const say = (m: string) => console.log(`[ringfence] ${m}`);

let local: LocalPg | null = null;

async function main(): Promise<void> {
  const config = loadConfig();
  let databaseUrl = config.databaseUrl;
  let stopping = false;
  let closeServer: (() => Promise<void>) | null = null;

  const shutdown = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    say(`${signal}: stopping…`);
    try {
      await closeServer?.();
    } finally {
      local?.stop();
      say('Stopped.');
      process.exit(0);
    }
  };
  process.on('SIGINT', () => void shutdown('SIGINT'));
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
  process.on('SIGHUP', () => void shutdown('SIGHUP'));

  if (!databaseUrl) {
    const dataDir = resolveDataDir(config.dataDir ?? path.join(root, '.data/pg'), say);
    local = await startLocalPg({ dataDir, say });
    await ensureDatabase(local.adminUrl, 'ringfence');
    databaseUrl = local.urlFor('ringfence');
    say(`PostgreSQL ${local.owned ? 'started' : 'reused'} on 127.0.0.1:${local.port} (data: ${dataDir})`);
  } else {
    say('Using the database at DATABASE_URL.');
  }
  if (stopping) return;
  if (!process.argv.includes('--dev')) await buildClientIfNeeded(say);
  const running = await startServer(config, databaseUrl, { say });
  closeServer = running.close;
  say(`Ringfence is ready on ${running.url}`);
  say(`Demo accounts (password "${DEMO_PASSWORD}" — change them before real use):`);
  for (const a of DEMO_ACCOUNTS) say(`  ${a.role.padEnd(9)} ${a.email}`);
}

main().catch((err: unknown) => {
  if (err instanceof PgSetupError) console.error(`[ringfence] ${err.message}`);
  else console.error('[ringfence] Could not start:', err instanceof Error ? err.message : err);
  local?.stop();
  process.exit(1);
});
