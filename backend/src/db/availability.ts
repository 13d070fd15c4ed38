import type pg from 'pg';
import type { Sequelize } from 'sequelize';

const CONNECTION_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND', 'EAI_AGAIN']);
const CONNECTION_NAMES = new Set([
  'SequelizeConnectionError',
  'SequelizeConnectionRefusedError',
  'SequelizeConnectionAcquireTimeoutError',
  'SequelizeConnectionTimedOutError',
  'SequelizeHostNotFoundError',
  'SequelizeHostNotReachableError',
]);
const CONNECTION_MESSAGES = [/connection terminated/i, /timeout exceeded when trying to connect/i, /not queryable/i, /terminating connection/i];

/**
 * True when an error means the database cannot be reached (refused, dropped, shutting down,
 * starting up) rather than a problem with the request. PostgreSQL codes: class 08 (connection
 * exception) and 57P01–57P03 (admin shutdown, crash shutdown, cannot connect now).
 */
export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 4) return false;
  const e = err as { name?: unknown; code?: unknown; message?: unknown; parent?: unknown; original?: unknown; cause?: unknown };
  if (typeof e.name === 'string' && CONNECTION_NAMES.has(e.name)) return true;
  if (typeof e.code === 'string' && (CONNECTION_CODES.has(e.code) || e.code.startsWith('08') || /^57P0[123]$/.test(e.code))) return true;
  if (typeof e.message === 'string' && CONNECTION_MESSAGES.some((re) => re.test(e.message as string))) return true;
  return [e.parent, e.original, e.cause].some((inner) => inner !== err && isDatabaseUnavailable(inner, depth + 1));
}

type Log = (msg: string, err?: unknown) => void;

/**
 * Listens for errors of idle pooled connections. pg emits them on the pool (or the client) when
 * the server goes away — stopped, failed over, or the backend terminated — and an 'error' event
 * nobody listens for ends the process. The pools drop the broken client and open a new one on
 * the next request, so the app comes back by itself when the database does.
 */
export function watchPgPool(pool: pg.Pool, log: Log): pg.Pool {
  pool.on('error', (err) => log('The database connection of the session store was lost; it reconnects on the next request.', brief(err)));
  return pool;
}

/** The same for Sequelize's pool: its connections get a listener as they are opened. */
export function watchSequelizePool(sequelize: Sequelize, log: Log): void {
  sequelize.addHook('afterConnect', (connection) => {
    (connection as pg.Client).on('error', (err) => log('A database connection was lost; it reconnects on the next request.', brief(err)));
  });
}

function brief(err: unknown): string {
  const e = err as { code?: string; message?: string };
  return [e?.code, e?.message].filter(Boolean).join(' ');
}
