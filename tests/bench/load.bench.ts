// Load benchmark: 100 connections for 30 s each on the signed-in projects list and on a layout read,
// against the real server (migrated, demo seeded) on a throwaway PostgreSQL.
// Targets: 0 errors (non-2xx or socket errors), p99 ≤ 100 ms (printed with ratios).
// Latency depends on the machine and what else runs on it; the statements and row writes per request
// (PostgreSQL's own counters) do not.
// Run: npm run bench load   (LOAD_SECONDS / LOAD_CONNECTIONS override the duration and connections)
import { mkdtempSync, rmSync, chmodSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import pg from 'pg';
import { ensureDatabase, startLocalPg } from '../../backend/scripts/pg';
import { spawn } from 'node:child_process';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../backend/src/db/seed';

const P99_TARGET_MS = 100;
const SECONDS = Number(process.env.LOAD_SECONDS ?? 30);
const CONNECTIONS = Number(process.env.LOAD_CONNECTIONS ?? 100);

const dir = mkdtempSync(path.join(os.tmpdir(), 'ringfence-load-pg-'));
chmodSync(dir, 0o755);
const local = await startLocalPg({ dataDir: path.join(dir, 'data'), fast: true });
try {
  await ensureDatabase(local.adminUrl, 'ringfence_load');
  // The server in a process of its own, so autocannon does not share its event loop.
  const child = spawn(process.execPath, ['--import', 'tsx', 'tests/support/serverProcess.ts'], {
    env: { ...process.env, DATABASE_URL: local.urlFor('ringfence_load') },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const server = {
    url: await new Promise<string>((resolve, reject) => {
      let out = '';
      child.stdout!.on('data', (b: Buffer) => {
        out += b.toString();
        const m = /READY (\S+)/.exec(out);
        if (m) resolve(m[1]);
      });
      child.once('exit', (code) => reject(new Error(`the server exited (${code}) before it was ready:\n${out}`)));
    }),
    close: () => new Promise<void>((resolve) => {
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
    }),
  };
  try {
    const planner = DEMO_ACCOUNTS.find((a) => a.role === 'planner')!;
    const login = await fetch(`${server.url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: planner.email, password: DEMO_PASSWORD }),
    });
    if (login.status !== 200) throw new Error(`sign-in failed: ${login.status} ${await login.text()}`);
    const cookie = (login.headers.get('set-cookie') ?? '').split(';')[0];
    const headers = { cookie };
    const projects = (await (await fetch(`${server.url}/api/projects`, { headers })).json()) as { projects: Array<{ id: number }> };
    const layouts = (await (await fetch(`${server.url}/api/projects/${projects.projects[0].id}/layouts`, { headers })).json()) as { layouts: Array<{ id: number }> };
    const targets = [
      { name: 'projects list', path: '/api/projects' },
      { name: 'layout read', path: `/api/layouts/${layouts.layouts[0].id}` },
    ];
    // What the database does per request (statements and row writes), from PostgreSQL's own
    // counters: unlike the latency figures, these do not depend on what else the machine runs.
    const stats = new pg.Client({ connectionString: local.adminUrl });
    await stats.connect();
    const dbCounters = async () => {
      await new Promise((r) => setTimeout(r, 1500)); // backends report their counters about once a second
      const row = (await stats.query(`SELECT xact_commit::float AS x, (tup_inserted + tup_updated + tup_deleted)::float AS w FROM pg_stat_database WHERE datname = 'ringfence_load'`)).rows[0] as { x: number; w: number };
      return row;
    };
    for (const t of targets) {
      const times: number[] = [];
      const before = await dbCounters();
      const run = autocannon({ url: `${server.url}${t.path}`, connections: CONNECTIONS, duration: SECONDS, headers });
      run.on('response', (_c, _status, _bytes, ms) => times.push(ms));
      const r = await run;
      const after = await dbCounters();
      const perRequest = (k: 'x' | 'w') => ((after[k] - before[k]) / Math.max(1, r.requests.total)).toFixed(2);
      times.sort((a, b) => a - b);
      const at = (p: number) => times[Math.min(times.length - 1, Math.floor((p / 100) * times.length))] ?? NaN;
      const errors = r.errors + r.timeouts + r.non2xx;
      const p99 = at(99);
      console.log(
        `${t.name}: ${CONNECTIONS} connections × ${SECONDS} s — p50 ${at(50).toFixed(1)} ms, p95 ${at(95).toFixed(1)} ms, ` +
          `p99 ${p99.toFixed(1)} ms (target ${P99_TARGET_MS} ms, ratio ${(p99 / P99_TARGET_MS).toFixed(2)}), ` +
          `${(r.requests.total / SECONDS).toFixed(0)} requests/s, errors ${errors} (target 0); ` +
          `database per request: ${perRequest('x')} statements, ${perRequest('w')} row writes`,
      );
      if (errors > 0 || p99 > P99_TARGET_MS) console.log(`${t.name}: over target`);
    }
    await stats.end();
  } finally {
    await server.close();
  }
} finally {
  local.stop();
  rmSync(dir, { recursive: true, force: true });
}
