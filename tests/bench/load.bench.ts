// Load benchmark: 100 connections for 30 s each on the signed-in projects list and on a layout read,
// against the real server (migrated, demo seeded) on a throwaway PostgreSQL.
// Targets: 0 errors (non-2xx or socket errors), p99 ≤ 100 ms (printed with ratios).
// Run: npm run bench load   (LOAD_SECONDS / LOAD_CONNECTIONS override the duration and connections)
import { mkdtempSync, rmSync, chmodSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { ensureDatabase, startLocalPg } from '../../backend/scripts/pg';
import { loadConfig } from '../../backend/src/config';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../backend/src/db/seed';
import { startServer } from '../../backend/src/server';

const P99_TARGET_MS = 100;
const SECONDS = Number(process.env.LOAD_SECONDS ?? 30);
const CONNECTIONS = Number(process.env.LOAD_CONNECTIONS ?? 100);

const dir = mkdtempSync(path.join(os.tmpdir(), 'ringfence-load-pg-'));
chmodSync(dir, 0o755);
const local = await startLocalPg({ dataDir: path.join(dir, 'data'), fast: true });
try {
  await ensureDatabase(local.adminUrl, 'ringfence_load');
  const config = loadConfig({ NODE_ENV: 'production', PORT: '0', BCRYPT_COST: '10' });
  const server = await startServer(config, local.urlFor('ringfence_load'), { quiet: true, clientDir: '/nonexistent' });
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
    for (const t of targets) {
      const times: number[] = [];
      const run = autocannon({ url: `${server.url}${t.path}`, connections: CONNECTIONS, duration: SECONDS, headers });
      run.on('response', (_c, _status, _bytes, ms) => times.push(ms));
      const r = await run;
      times.sort((a, b) => a - b);
      const at = (p: number) => times[Math.min(times.length - 1, Math.floor((p / 100) * times.length))] ?? NaN;
      const errors = r.errors + r.timeouts + r.non2xx;
      const p99 = at(99);
      console.log(
        `${t.name}: ${CONNECTIONS} connections × ${SECONDS} s — p50 ${at(50).toFixed(1)} ms, p95 ${at(95).toFixed(1)} ms, ` +
          `p99 ${p99.toFixed(1)} ms (target ${P99_TARGET_MS} ms, ratio ${(p99 / P99_TARGET_MS).toFixed(2)}), ` +
          `${(r.requests.total / SECONDS).toFixed(0)} requests/s, errors ${errors} (target 0)`,
      );
      if (errors > 0 || p99 > P99_TARGET_MS) console.log(`${t.name}: over target`);
    }
  } finally {
    await server.close();
  }
} finally {
  local.stop();
  rmSync(dir, { recursive: true, force: true });
}
