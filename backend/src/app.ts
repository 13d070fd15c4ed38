import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import connectPgSimple from 'connect-pg-simple';
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import type pg from 'pg';
import type { Sequelize } from 'sequelize';
import { createPassport } from './auth/passport';
import { sameOriginGuard } from './auth/origin';
import { sessionLifetime } from './auth/sessionLifetime';
import type { Config } from './config';
import { featureRouters } from './features';
import type { Mailer } from './services/mail/mailer';
import { apiNotFound, errorMiddleware, plainErrorMiddleware } from './http/errors';
import { allowedHostCheck } from './http/hosts';
import { archiveRouter } from './routes/archive';
import { authRouter } from './routes/auth';
import { healthRouter } from './routes/health';
import { projectsRouter } from './routes/projects';
import { usersRouter } from './routes/users';

export interface AppDeps {
  config: Config;
  sequelize: Sequelize;
  /** pg pool for the session store (give it an 'error' listener: db/availability watchPgPool). */
  pool: pg.Pool;
  /** Folder of the built client (index.html + assets); not served when missing. */
  clientDir?: string;
  sessionSecret: string;
  log?: (msg: string, err?: unknown) => void;
  /** Outgoing mail for review, release and invitation messages. */
  mailer?: Mailer;
  /** Clock for expiring things (invitations, session lifetime); defaults to the system clock. */
  now?: () => Date;
}

export const DEFAULT_CLIENT_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../dist/client');

/** Builds the Express app (no listen) — supertest and the server both use it. */
export function createApp(deps: AppDeps): Express {
  const { config, sequelize } = deps;
  const log = deps.log ?? ((msg, err) => console.error(`[ringfence] ${msg}`, err ?? ''));
  const now = deps.now ?? (() => new Date());
  const app = express();
  app.disable('x-powered-by');
  if (config.trustProxy) app.set('trust proxy', config.trustProxy);
  app.use(allowedHostCheck(config));

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'script-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'worker-src': ["'self'", 'blob:'],
          'object-src': ["'self'", 'blob:'],
          'frame-src': ["'self'", 'blob:'],
          'connect-src': ["'self'"],
          'upgrade-insecure-requests': config.secureCookies ? [] : null,
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );

  const PgStore = connectPgSimple(session);
  const pp = createPassport({ bcryptCost: config.bcryptCost });
  const api = express.Router();
  api.use(express.json({ limit: '20mb' }));
  // Before the session: a monitor asks without a cookie, and the answer must not need the store.
  api.use(healthRouter(sequelize));
  api.use(
    session({
      name: 'rf.sid',
      store: new PgStore({
        pool: deps.pool,
        tableName: 'session',
        createTableIfMissing: false,
        pruneSessionInterval: 15 * 60,
        // No write per request: sessionLifetime pushes the idle expiry forward now and then.
        disableTouch: true,
        errorLog: (...args: unknown[]) => log('Session store', args.map(String).join(' ')),
      }),
      secret: deps.sessionSecret,
      resave: false,
      saveUninitialized: false,
      rolling: false,
      cookie: { httpOnly: true, sameSite: 'lax', secure: config.secureCookies, maxAge: config.sessionIdleMs },
    }),
  );
  api.use(sessionLifetime({ lifetimeMs: config.sessionLifetimeMs, idleMs: config.sessionIdleMs, now }));
  api.use(pp.initialize());
  api.use(pp.session());
  api.use(sameOriginGuard(config.allowedOrigins));
  api.use((_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });

  api.use(authRouter(pp, sequelize, { limit: config.loginRateLimit, ipLimit: config.loginIpRateLimit, windowMs: config.loginRateWindowMs, now }));
  api.use(archiveRouter(sequelize));
  api.use(projectsRouter(sequelize));
  api.use(usersRouter(sequelize, { bcryptCost: config.bcryptCost }));
  for (const router of featureRouters({ config, sequelize, mailer: deps.mailer, now: deps.now })) api.use(router);
  api.use(apiNotFound);
  api.use(errorMiddleware(log));
  app.use('/api', api);

  const clientDir = deps.clientDir ?? DEFAULT_CLIENT_DIR;
  if (existsSync(path.join(clientDir, 'index.html'))) {
    app.use('/assets', express.static(path.join(clientDir, 'assets'), { immutable: true, maxAge: '365d', fallthrough: false }));
    app.use(express.static(clientDir, { index: false }));
    app.get('/{*splat}', (_req, res) => {
      res.set('Cache-Control', 'no-cache');
      res.sendFile(path.join(clientDir, 'index.html'));
    });
  } else {
    app.get('/', (_req, res) => {
      res.type('text/plain').send('Ringfence API is running. The web client is not built: run `npm run build`.');
    });
  }
  app.use(plainErrorMiddleware(log));
  return app;
}
