import type { Request, RequestHandler } from 'express';
import { rateLimit, type IncrementResponse, type Options, type Store } from 'express-rate-limit';
import { QueryTypes, type Sequelize } from 'sequelize';
import { HttpError } from './errors';

/**
 * express-rate-limit Store on our own `rate_limit_hits` table, through the app's Sequelize
 * connection, so several servers on one database share the counters. We deliberately do not use
 * a published PostgreSQL store package: it brings its own copy of pg and its own migration runner,
 * outside the umzug migrations every other table goes through.
 */
export class PgRateLimitStore implements Store {
  localKeys = false;
  private windowMs = 60_000;
  private lastSweep = 0;

  constructor(
    private readonly sequelize: Sequelize,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<IncrementResponse> {
    // One statement: a new key starts at 1, an expired one starts a new window, otherwise +1.
    const rows = await this.sequelize.query<{ hits: number; resetAt: Date }>(
      `INSERT INTO rate_limit_hits (key, hits, "resetAt") VALUES (:key, 1, now() + make_interval(secs => :secs))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN rate_limit_hits."resetAt" <= now() THEN 1 ELSE rate_limit_hits.hits + 1 END,
         "resetAt" = CASE WHEN rate_limit_hits."resetAt" <= now() THEN EXCLUDED."resetAt" ELSE rate_limit_hits."resetAt" END
       RETURNING hits, "resetAt"`,
      { replacements: { key: this.prefix + key, secs: this.windowMs / 1000 }, type: QueryTypes.SELECT },
    );
    this.sweepNowAndThen();
    return { totalHits: Number(rows[0].hits), resetTime: new Date(rows[0].resetAt) };
  }

  async decrement(key: string): Promise<void> {
    await this.sequelize.query(`UPDATE rate_limit_hits SET hits = GREATEST(hits - 1, 0) WHERE key = :key`, { replacements: { key: this.prefix + key } });
  }

  async resetKey(key: string): Promise<void> {
    await this.sequelize.query(`DELETE FROM rate_limit_hits WHERE key = :key`, { replacements: { key: this.prefix + key } });
  }

  /** Drops counters whose window has passed, at most once a window per server. */
  private sweepNowAndThen(): void {
    const t = Date.now();
    if (t - this.lastSweep < this.windowMs) return;
    this.lastSweep = t;
    this.sequelize.query(`DELETE FROM rate_limit_hits WHERE "resetAt" < now()`).catch(() => {});
  }
}

/** A limiter with counters in PostgreSQL that answers 429 with the given sentence. */
export function pgRateLimit(
  sequelize: Sequelize,
  opts: { name: string; limit: number; windowMs: number; key: (req: Request) => string; message: string },
): RequestHandler {
  return rateLimit({
    windowMs: opts.windowMs,
    limit: opts.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PgRateLimitStore(sequelize, `${opts.name}:`),
    keyGenerator: opts.key,
    handler: (_req, _res, next) => next(new HttpError(429, 'rate_limited', opts.message)),
  });
}
