// Per-file test database (copied from the migrated template) and the app on it, for API tests.
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import request from 'supertest';
import type { Express } from 'express';
import type { Sequelize } from 'sequelize';
import { inject } from 'vitest';
import { createApp } from '../../backend/src/app';
import { loadConfig, type Config } from '../../backend/src/config';
import { watchPgPool } from '../../backend/src/db/availability';
import { createSequelize } from '../../backend/src/db/sequelize';
import type { Mailer } from '../../backend/src/services/mail/mailer';
import { TEMPLATE_DB } from './pgForTests';

export interface TestDb {
  name: string;
  url: string;
  drop(): Promise<void>;
}

async function admin<T>(fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: inject('pgAdminUrl') });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

/** A fresh database copied from the migrated template. */
export async function createTestDb(): Promise<TestDb> {
  const name = `t_${process.pid}_${randomBytes(4).toString('hex')}`;
  await admin((c) => c.query(`CREATE DATABASE "${name}" TEMPLATE "${TEMPLATE_DB}"`));
  const url = inject('pgAdminUrl').replace(/\/postgres$/, `/${name}`);
  return {
    name,
    url,
    drop: () => admin((c) => c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`)).then(() => undefined),
  };
}

export function testConfig(overrides: Record<string, string> = {}): Config {
  return loadConfig({ NODE_ENV: 'test', BCRYPT_COST: '4', LOGIN_RATE_LIMIT: '1000', LOGIN_IP_RATE_LIMIT: '100000', INVITE_RATE_LIMIT: '100000', PORT: '0', ...overrides });
}

export interface TestApp {
  app: Express;
  sequelize: Sequelize;
  config: Config;
  db: TestDb;
  /** Another app on the same database with other settings (models bind to one Sequelize per process). */
  appWith(configOverrides: Record<string, string>): Express;
  close(): Promise<void>;
}

/** The app on a fresh database; call close() in afterAll. */
export interface TestAppOptions {
  /** Outgoing mail (e.g. createMailer against startFakeSmtp()). */
  mailer?: Mailer;
  /** The app's clock (invitation expiry, session lifetime). */
  now?: () => Date;
  /** Folder of a built client to serve (none by default). */
  clientDir?: string;
  /** Receives what the app logs (server errors); silent by default. */
  log?: (msg: string, err?: unknown) => void;
}

export async function createTestApp(configOverrides: Record<string, string> = {}, options: TestAppOptions = {}): Promise<TestApp> {
  const db = await createTestDb();
  const config = testConfig(configOverrides);
  const sequelize = createSequelize(db.url, { pool: 5 });
  const pool = watchPgPool(new pg.Pool({ connectionString: db.url, max: 3 }), () => {});
  const make = (c: Config) => createApp({ config: c, sequelize, pool, sessionSecret: 'test-secret-test-secret', clientDir: options.clientDir ?? '/nonexistent', log: options.log ?? (() => {}), mailer: options.mailer, now: options.now });
  return {
    app: make(config),
    sequelize,
    config,
    db,
    appWith: (overrides) => make(testConfig({ ...configOverrides, ...overrides })),
    async close() {
      await pool.end();
      await sequelize.close();
      await db.drop();
    },
  };
}

/** A supertest agent (keeps cookies) signed in with the given credentials. */
export async function signedIn(app: Express, email: string, password: string): Promise<ReturnType<typeof request.agent>> {
  const agent = request.agent(app);
  const res = await agent.post('/api/auth/login').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return agent;
}

/** GET of a binary answer (a PDF, a DXF) with its body as one Buffer. */
export function getBytes(agent: ReturnType<typeof request.agent>, url: string) {
  return agent
    .get(url)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
}
