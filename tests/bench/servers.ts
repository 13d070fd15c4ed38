// What the server benchmarks share: a throwaway PostgreSQL, the real server in processes of its own
// (tests/support/serverProcess.ts, so the load generator does not share their event loops), sign-in,
// and an autocannon run spread over one or more servers. Everything started here is stopped by
// stopAll(), which also runs when the process exits or is interrupted.
import { spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { ensureDatabase, startLocalPg, type LocalPg } from '../../backend/scripts/pg';

export interface BenchServer {
  url: string;
  close(): Promise<void>;
}

const children = new Set<ChildProcess>();
const cleanups: Array<() => void> = [];

/** Stops every server process and database this process started (synchronous, safe to repeat). */
export function stopAll(): void {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
  children.clear();
  while (cleanups.length) cleanups.pop()!();
}
process.on('exit', stopAll);
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    stopAll();
    process.exit(130);
  });
}

/** A fast (fsync off) PostgreSQL in a temp directory with one empty database; removed by stopAll(). */
export async function startBenchPg(database: string): Promise<{ local: LocalPg; url: string }> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'ringfence-bench-pg-'));
  chmodSync(dir, 0o755);
  let local: LocalPg | null = null;
  cleanups.push(() => {
    local?.stop();
    rmSync(dir, { recursive: true, force: true });
  });
  local = await startLocalPg({ dataDir: path.join(dir, 'data'), fast: true });
  await ensureDatabase(local.adminUrl, database);
  return { local, url: local.urlFor(database) };
}

/**
 * The real server (migrates, seeds the demo when the database is empty) in a process of its own on a
 * free port. Start the first one alone: two at once on an empty database would both migrate.
 */
export async function startServerProcess(databaseUrl: string, env: Record<string, string> = {}): Promise<BenchServer> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'tests/support/serverProcess.ts'], {
    env: { ...process.env, ...env, DATABASE_URL: databaseUrl },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  children.add(child);
  const url = await new Promise<string>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (b: Buffer) => {
      out += b.toString();
      const m = /READY (\S+)/.exec(out);
      if (m) resolve(m[1]);
    });
    child.once('exit', (code) => reject(new Error(`the server exited (${code}) before it was ready:\n${out}`)));
  });
  return {
    url,
    close: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null || child.signalCode !== null) return resolve();
        child.once('exit', () => {
          children.delete(child);
          resolve();
        });
        child.kill('SIGTERM');
      }),
  };
}

/** POST /api/auth/login; returns the status and the session cookie ("rf.sid=…") when one was set. */
export async function signIn(url: string, email: string, password: string): Promise<{ status: number; cookie: string; body: string }> {
  const r = await fetch(`${url}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  const cookie = r.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  return { status: r.status, cookie, body: await r.text() };
}

export interface LoadResult {
  requests: number;
  perSecond: number;
  errors: number;
  /** Latency at a percentile, ms (every response's own time, over all servers). */
  at(p: number): number;
}

/**
 * `connections` connections for `seconds` on one path, split evenly over the servers (what a
 * load balancer that spreads connections round-robin does), run at once from this process.
 */
export async function loadRun(urls: string[], pathname: string, opts: { connections: number; seconds: number; headers: Record<string, string> }): Promise<LoadResult> {
  const times: number[] = [];
  const share = (i: number) => Math.floor(opts.connections / urls.length) + (i < opts.connections % urls.length ? 1 : 0);
  const runs = urls.map((u, i) => {
    const run = autocannon({ url: `${u}${pathname}`, connections: share(i), duration: opts.seconds, headers: opts.headers });
    run.on('response', (_c, _status, _bytes, ms) => times.push(ms));
    return run;
  });
  const results = await Promise.all(runs);
  times.sort((a, b) => a - b);
  const requests = results.reduce((n, r) => n + r.requests.total, 0);
  return {
    requests,
    perSecond: requests / opts.seconds,
    errors: results.reduce((n, r) => n + r.errors + r.timeouts + r.non2xx, 0),
    at: (p) => times[Math.min(times.length - 1, Math.floor((p / 100) * times.length))] ?? NaN,
  };
}
