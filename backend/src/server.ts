import http from 'node:http';
import pg from 'pg';
import type { Sequelize } from 'sequelize';
import { createApp, type AppDeps } from './app';
import { watchPgPool, watchSequelizePool } from './db/availability';
import type { Config } from './config';
import { ensureBuiltInCatalogue } from './db/demoCatalogue';
import { migrateUp } from './db/migrate';
import { createSequelize } from './db/sequelize';
import { seedDemoIfEmpty } from './db/seed';
import { ensureSessionSecret } from './db/settings';
import { featureSeedSteps } from './features';
import { startFakeSmtp, type FakeSmtp } from './services/mail/fakeSmtp';
import { createMailer, type Mailer } from './services/mail/mailer';
import { closeHeavyWork } from './services/workerPool';

export interface RunningServer {
  url: string;
  server: http.Server;
  sequelize: Sequelize;
  mailer: Mailer;
  /** The local mail fake, when SMTP_URL is not set. */
  fakeSmtp: FakeSmtp | null;
  close(): Promise<void>;
}

/** Migrates, seeds the demo when empty, and listens. Used by `npm start` and the e2e tests. */
export async function startServer(
  config: Config,
  databaseUrl: string,
  opts: { clientDir?: string; seed?: boolean; say?: (m: string) => void; quiet?: boolean } = {},
): Promise<RunningServer> {
  const say = opts.say ?? (() => {});
  const warn = opts.quiet ? () => {} : (msg: string, detail?: unknown) => console.error(`[ringfence] ${msg}`, detail ?? '');
  const sequelize = createSequelize(databaseUrl);
  watchSequelizePool(sequelize, warn);
  const applied = await migrateUp(sequelize);
  if (applied.length) say(`Applied ${applied.length} migration(s).`);
  await ensureBuiltInCatalogue(sequelize);
  if (opts.seed !== false) {
    const seeded = await seedDemoIfEmpty(sequelize, { bcryptCost: config.bcryptCost, steps: featureSeedSteps() });
    if (seeded) say('Seeded the demo data (Fernhill Biscuit Works).');
  }
  const fakeSmtp = config.smtpUrl ? null : await startFakeSmtp({ log: say });
  if (fakeSmtp) say(`Local mail fake listening on ${fakeSmtp.url} (messages appear in the admin mail outbox).`);
  const mailer = createMailer(config.smtpUrl ?? fakeSmtp!.url, config.mailFrom);
  const pool = watchPgPool(new pg.Pool({ connectionString: databaseUrl, max: 10, connectionTimeoutMillis: 5_000 }), warn);
  const sessionSecret = await ensureSessionSecret(sequelize, config.sessionSecret);
  const deps: AppDeps = {
    config,
    sequelize,
    pool,
    sessionSecret,
    clientDir: opts.clientDir,
    mailer,
    log: opts.quiet ? () => {} : undefined,
  };
  const app = createApp(deps);
  const server = http.createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  });
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : config.port;
  return {
    url: `http://${config.host}:${port}`,
    server,
    sequelize,
    mailer,
    fakeSmtp,
    async close() {
      server.closeAllConnections();
      await new Promise<void>((r) => server.close(() => r()));
      mailer.close();
      await fakeSmtp?.close();
      await pool.end().catch(() => {});
      await sequelize.close().catch(() => {});
      await closeHeavyWork().catch(() => {});
    },
  };
}
