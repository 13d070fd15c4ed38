import { availableParallelism } from 'node:os';
import { z } from 'zod';

/** Environment parsed once at start; every setting has a default for local use. */
const ConfigSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  DATABASE_URL: z.string().optional(),
  SMTP_URL: z.string().optional(),
  MAIL_FROM: z.string().default('Ringfence <no-reply@ringfence.local>'),
  RINGFENCE_DATA_DIR: z.string().optional(),
  SESSION_SECRET: z.string().min(16).optional(),
  /** Set when the site is served over HTTPS (behind a TLS-terminating proxy): Secure cookies. */
  SECURE_COOKIES: z.enum(['0', '1', 'true', 'false']).default('0').transform((v) => v === '1' || v === 'true'),
  TRUST_PROXY: z.coerce.number().int().min(0).default(0),
  /** Extra allowed origins for state-changing requests (comma-separated), besides the site's own. */
  ALLOWED_ORIGINS: z.string().default(''),
  BCRYPT_COST: z.coerce.number().int().min(4).max(15).default(10),
  LOGIN_RATE_LIMIT: z.coerce.number().int().min(1).default(20),
  LOGIN_RATE_WINDOW_MS: z.coerce.number().int().min(1000).default(10 * 60 * 1000),
  /** Sign-in attempts from one address across every account per window (password spraying). */
  LOGIN_IP_RATE_LIMIT: z.coerce.number().int().min(1).default(100),
  /** Requests to the public invitation-link routes from one address per window. */
  INVITE_RATE_LIMIT: z.coerce.number().int().min(1).default(30),
  /** Idle lifetime of a session: it ends this long after the last request (rolling). */
  SESSION_IDLE_HOURS: z.coerce.number().positive().default(12),
  /** Absolute lifetime of a session: it ends this long after sign-in, however busy. */
  SESSION_LIFETIME_HOURS: z.coerce.number().positive().default(7 * 24),
  /** Host names (with :port when not the default) the server answers to, comma-separated. */
  ALLOWED_HOSTS: z.string().default(''),
  UPLOAD_LIMIT_MB: z.coerce.number().positive().default(50),
  /** The address people open (https://cells.example.com); mail links are built from it. */
  PUBLIC_URL: z
    .string()
    .url('PUBLIC_URL must be a full URL such as https://cells.example.com')
    .refine((u) => /^https?:\/\//.test(u), 'PUBLIC_URL must start with http:// or https://')
    .optional(),
  /** Worker threads for heavy work (analysis, reach, plan sheets); default: one less than the CPU count, at least 1. */
  HEAVY_WORKERS: z.coerce.number().int().min(1).max(64).optional(),
  /** Time one heavy task may take before it is stopped (503 too_slow), ms. */
  HEAVY_TASK_TIMEOUT_MS: z.coerce.number().int().min(100).default(20_000),
  /** Heavy tasks that may wait for a worker; beyond that a request gets 503 busy. */
  HEAVY_QUEUE_LIMIT: z.coerce.number().int().min(0).default(16),
  /** Heap limit of each heavy-work thread, MB. */
  HEAVY_WORKER_HEAP_MB: z.coerce.number().int().min(64).default(2048),
  /** DXF imports one server runs at once; beyond that 429 with Retry-After. */
  DXF_IMPORT_CONCURRENCY: z.coerce.number().int().min(1).default(2),
  /** Most reach checks (arms × work points × work heights) one analysis may ask for. */
  ANALYSIS_MAX_CHECKS: z.coerce.number().int().min(1).default(2_000_000),
});

export type Config = {
  env: 'development' | 'production' | 'test';
  port: number;
  host: string;
  databaseUrl?: string;
  smtpUrl?: string;
  mailFrom: string;
  dataDir?: string;
  sessionSecret?: string;
  secureCookies: boolean;
  trustProxy: number;
  allowedOrigins: string[];
  bcryptCost: number;
  loginRateLimit: number;
  loginRateWindowMs: number;
  loginIpRateLimit: number;
  inviteRateLimit: number;
  sessionIdleMs: number;
  sessionLifetimeMs: number;
  /** Host header values accepted (lower case, host[:port]); empty = the defaults of allowedHostCheck. */
  allowedHosts: string[];
  uploadLimitBytes: number;
  publicUrl?: string;
  heavyWorkers: number;
  heavyTaskTimeoutMs: number;
  heavyQueueLimit: number;
  heavyWorkerHeapMb: number;
  dxfImportConcurrency: number;
  analysisMaxChecks: number;
};

/** Reads the configuration from an environment (process.env by default); throws a readable message. */
export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const parsed = ConfigSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  return {
    env: c.NODE_ENV,
    port: c.PORT,
    host: c.HOST,
    databaseUrl: c.DATABASE_URL,
    smtpUrl: c.SMTP_URL,
    mailFrom: c.MAIL_FROM,
    dataDir: c.RINGFENCE_DATA_DIR,
    sessionSecret: c.SESSION_SECRET,
    secureCookies: c.SECURE_COOKIES,
    trustProxy: c.TRUST_PROXY,
    allowedOrigins: c.ALLOWED_ORIGINS.split(',').map((s) => s.trim()).filter(Boolean),
    bcryptCost: c.BCRYPT_COST,
    loginRateLimit: c.LOGIN_RATE_LIMIT,
    loginRateWindowMs: c.LOGIN_RATE_WINDOW_MS,
    loginIpRateLimit: c.LOGIN_IP_RATE_LIMIT,
    inviteRateLimit: c.INVITE_RATE_LIMIT,
    sessionIdleMs: Math.round(c.SESSION_IDLE_HOURS * 3600_000),
    sessionLifetimeMs: Math.round(c.SESSION_LIFETIME_HOURS * 3600_000),
    allowedHosts: c.ALLOWED_HOSTS.split(',').map((s) => s.trim().toLowerCase()).filter(Boolean),
    uploadLimitBytes: Math.round(c.UPLOAD_LIMIT_MB * 1024 * 1024),
    publicUrl: c.PUBLIC_URL?.replace(/\/+$/, ''),
    heavyWorkers: c.HEAVY_WORKERS ?? Math.max(1, availableParallelism() - 1),
    heavyTaskTimeoutMs: c.HEAVY_TASK_TIMEOUT_MS,
    heavyQueueLimit: c.HEAVY_QUEUE_LIMIT,
    heavyWorkerHeapMb: c.HEAVY_WORKER_HEAP_MB,
    dxfImportConcurrency: c.DXF_IMPORT_CONCURRENCY,
    analysisMaxChecks: c.ANALYSIS_MAX_CHECKS,
  };
}
