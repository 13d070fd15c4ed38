// A dropped or stopped database must not end the server: requests meanwhile get 503, and the
// server answers normally again by itself once the database is back. The server runs in a child
// process (so its exit would show) on a PostgreSQL of this file's own, which the test stops.
import { spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureDatabase, startLocalPg, type LocalPg } from '../../backend/scripts/pg';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../backend/src/db/seed';

const DB = 'ringfence_outage';
let dir: string;
let local: LocalPg;
let child: ChildProcess;
let base = '';
let output = '';
let exited: number | string | null = null;

beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), 'ringfence-outage-pg-'));
  chmodSync(dir, 0o755);
  local = await startLocalPg({ dataDir: path.join(dir, 'data'), fast: true });
  await ensureDatabase(local.adminUrl, DB);
  child = spawn(process.execPath, ['--import', 'tsx', 'tests/support/serverProcess.ts'], {
    env: { ...process.env, DATABASE_URL: local.urlFor(DB) },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.on('exit', (code, signal) => {
    exited = code ?? signal;
  });
  base = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${output}`)), 60_000);
    const onData = (b: Buffer) => {
      output += b.toString();
      const m = /READY (\S+)/.exec(output);
      if (m) {
        clearTimeout(timer);
        resolve(m[1]);
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (b: Buffer) => (output += b.toString()));
    child.on('exit', () => reject(new Error(`server exited while starting:\n${output}`)));
  });
}, 120_000);

afterAll(async () => {
  if (child && exited === null) {
    child.kill('SIGTERM');
    await new Promise((r) => child.once('exit', r));
  }
  local?.stop();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Polls until `ok(status)` or the time is up; returns every status seen. */
async function until(get: () => Promise<Response>, ok: (s: number) => boolean, ms: number): Promise<number[]> {
  const seen: number[] = [];
  const end = Date.now() + ms;
  while (Date.now() < end) {
    const status = (await get()).status;
    seen.push(status);
    if (ok(status)) return seen;
    await sleep(200);
  }
  return seen;
}

describe('database outage', () => {
  it('answers 503 while the database is gone and recovers by itself, never exiting', async () => {
    const planner = DEMO_ACCOUNTS.find((a) => a.role === 'planner')!;
    const login = await fetch(`${base}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: planner.email, password: DEMO_PASSWORD }),
    });
    expect(login.status).toBe(200);
    const cookie = (login.headers.get('set-cookie') ?? '').split(';')[0];
    const projects = () => fetch(`${base}/api/projects`, { headers: { cookie } });
    const health = () => fetch(`${base}/api/health`);
    expect((await projects()).status).toBe(200);

    // 1. Every connection of the app's database terminated (as a failover or an admin would).
    const admin = new pg.Client({ connectionString: local.adminUrl });
    await admin.connect();
    const killed = await admin.query(`SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = $1 AND pid <> pg_backend_pid()`, [DB]);
    await admin.end();
    expect(killed.rowCount).toBeGreaterThan(0);
    await sleep(500);
    expect(exited).toBeNull();
    const afterKill = await until(projects, (s) => s === 200, 10_000);
    expect(afterKill.at(-1)).toBe(200);
    expect(afterKill.every((s) => s === 200 || s === 503)).toBe(true);

    // 2. The database server stopped under the running app.
    const port = local.port;
    local.stop();
    await sleep(500);
    expect(exited).toBeNull();
    const down = await health();
    expect(down.status).toBe(503);
    expect(await down.json()).toEqual({ ok: false, db: 'down' });
    const during = await projects();
    expect(during.status).toBe(503);
    expect((await during.json()).error).toMatchObject({ code: 'unavailable', message: expect.stringMatching(/database/i) });
    const loginDuring = await fetch(`${base}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: planner.email, password: DEMO_PASSWORD }),
    });
    expect(loginDuring.status).toBe(503);
    expect(exited).toBeNull();

    // 3. Back on the same port: the app answers normally within seconds, same session.
    local = await startLocalPg({ dataDir: path.join(dir, 'data'), fast: true, port });
    const healthBack = await until(health, (s) => s === 200, 10_000);
    expect(healthBack.at(-1)).toBe(200);
    const back = await until(projects, (s) => s === 200, 5_000);
    expect(back.at(-1)).toBe(200);
    expect(exited).toBeNull();
  }, 90_000);
});
