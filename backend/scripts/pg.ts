// Local PostgreSQL lifecycle: find Debian's server binaries, init a data directory, start on
// 127.0.0.1 on a free port, create the database, stop cleanly. Used by `npm start` and `npm test`.
import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, readFileSync, readdirSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { createHash } from 'node:crypto';
import pg from 'pg';

export class PgSetupError extends Error {}

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

/** Directory holding pg_ctl/initdb: /usr/lib/postgresql/<newest>/bin, or `pg_config --bindir`. */
export function findPgBin(): string {
  const base = '/usr/lib/postgresql';
  if (existsSync(base)) {
    const versions = readdirSync(base)
      .filter((v) => existsSync(path.join(base, v, 'bin', 'pg_ctl')))
      .sort((a, b) => Number(b) - Number(a));
    if (versions.length) return path.join(base, versions[0], 'bin');
  }
  const r = spawnSync('pg_config', ['--bindir'], { encoding: 'utf8' });
  const dir = r.status === 0 ? r.stdout.trim() : '';
  if (dir && existsSync(path.join(dir, 'pg_ctl'))) return dir;
  throw new PgSetupError('PostgreSQL server binaries not found. Install them with: apt-get install postgresql');
}

/** Runs a server binary, as the `postgres` system user when we are root (PostgreSQL refuses root). */
function runPg(bin: string, args: string[], opts: { allowFail?: boolean } = {}): { status: number; out: string } {
  const cmd = isRoot ? 'runuser' : bin;
  const full = isRoot ? ['-u', 'postgres', '--', bin, ...args] : args;
  const r = spawnSync(cmd, full, { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  const out = `${r.stdout ?? ''}${r.stderr ?? ''}`;
  if (r.status !== 0 && !opts.allowFail) throw new PgSetupError(`${path.basename(bin)} failed: ${out.trim() || r.error?.message}`);
  return { status: r.status ?? 1, out };
}

/** True when the postgres system user can enter every parent directory of dir. */
function postgresCanReach(dir: string): boolean {
  if (!isRoot) return true;
  const r = spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', path.dirname(path.resolve(dir))]);
  return r.status === 0;
}

/** A free TCP port on 127.0.0.1. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.unref();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

export interface LocalPg {
  dataDir: string;
  port: number;
  /** URL of the server's maintenance database (postgres) as superuser `app`. */
  adminUrl: string;
  urlFor(db: string): string;
  /** True when this process started the server (and so stops it). */
  owned: boolean;
  stop(): void;
}

/** Picks the data directory: the requested one, or one under the temp dir when postgres cannot reach it. */
export function resolveDataDir(requested: string, say: (m: string) => void): string {
  mkdirSync(requested, { recursive: true });
  if (postgresCanReach(requested)) return path.resolve(requested);
  const hash = createHash('sha1').update(path.resolve(requested)).digest('hex').slice(0, 10);
  const fallback = path.join(os.tmpdir(), `ringfence-pg-${hash}`);
  say(`The postgres system user cannot enter ${path.dirname(path.resolve(requested))}; keeping the database in ${fallback} instead.`);
  mkdirSync(fallback, { recursive: true });
  return fallback;
}

/** Starts (initialising on first use) a PostgreSQL server for dataDir on 127.0.0.1 (on `port`, or a free one). */
export async function startLocalPg(opts: { dataDir: string; fast?: boolean; port?: number; say?: (m: string) => void }): Promise<LocalPg> {
  const say = opts.say ?? (() => {});
  const bin = findPgBin();
  const dataDir = opts.dataDir;
  mkdirSync(dataDir, { recursive: true });
  if (isRoot) {
    execFileSync('chown', ['-R', 'postgres:postgres', dataDir]);
    chmodSync(dataDir, 0o700);
  }
  if (!existsSync(path.join(dataDir, 'PG_VERSION'))) {
    say(`Initialising a PostgreSQL data directory in ${dataDir}`);
    runPg(path.join(bin, 'initdb'), ['-D', dataDir, '-U', 'app', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
  }
  const logFile = path.join(dataDir, 'server.log');
  const status = runPg(path.join(bin, 'pg_ctl'), ['-D', dataDir, 'status'], { allowFail: true });
  let port: number;
  let owned = false;
  if (status.status === 0) {
    // Already running (another `npm start` on the same data): reuse it and leave it running.
    const pid = readFileSync(path.join(dataDir, 'postmaster.pid'), 'utf8').split('\n');
    port = Number(pid[3]);
    say(`PostgreSQL already runs on port ${port} for this data directory; reusing it.`);
  } else {
    port = opts.port ?? (await freePort());
    const settings = [`-p ${port}`, '-c listen_addresses=127.0.0.1', "-c unix_socket_directories=''"];
    if (opts.fast) settings.push('-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off');
    runPg(path.join(bin, 'pg_ctl'), ['-D', dataDir, '-l', logFile, '-w', '-t', '60', '-o', settings.join(' '), 'start']);
    owned = true;
  }
  const urlFor = (db: string) => `postgres://app@127.0.0.1:${port}/${db}`;
  const local: LocalPg = {
    dataDir,
    port,
    adminUrl: urlFor('postgres'),
    urlFor,
    owned,
    stop() {
      if (!owned) return;
      owned = false;
      const r = runPg(path.join(bin, 'pg_ctl'), ['-D', dataDir, '-m', 'fast', '-w', '-t', '30', 'stop'], { allowFail: true });
      if (r.status !== 0) say(`PostgreSQL did not stop cleanly: ${r.out.trim()}`);
    },
  };
  await waitForPg(local.adminUrl);
  return local;
}

/** Waits until the server accepts connections (up to ~30 s). */
export async function waitForPg(url: string): Promise<void> {
  for (let i = 0; i < 150; i++) {
    const c = new pg.Client({ connectionString: url });
    try {
      await c.connect();
      await c.end();
      return;
    } catch {
      await c.end().catch(() => {});
      await new Promise((r) => setTimeout(r, 200));
    }
  }
  throw new PgSetupError(`PostgreSQL did not accept connections at ${url}`);
}

/** Creates a database when it does not exist (optionally from a template). */
export async function ensureDatabase(adminUrl: string, name: string, template?: string): Promise<void> {
  const c = new pg.Client({ connectionString: adminUrl });
  await c.connect();
  try {
    const r = await c.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]);
    if (r.rowCount === 0) await c.query(`CREATE DATABASE "${name}"${template ? ` TEMPLATE "${template}"` : ''}`);
  } finally {
    await c.end();
  }
}
