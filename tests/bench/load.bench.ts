// Load benchmark: 100 connections for 30 s each on the signed-in projects list and on a layout read,
// against the real server (migrated, demo seeded) on a throwaway PostgreSQL.
// Targets: 0 errors (non-2xx or socket errors), p99 ≤ 100 ms (reported with ratios, report.ts).
// Latency depends on the machine and what else runs on it; the statements and row writes per request
// (PostgreSQL's own counters) do not.
// Run: npm run bench load   (LOAD_SECONDS / LOAD_CONNECTIONS override the duration and connections)
import pg from 'pg';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../backend/src/db/seed';
import { report } from './report';
import { loadRun, signIn, startBenchPg, startServerProcess, stopAll } from './servers';

const P99_TARGET_MS = 100;
const SECONDS = Number(process.env.LOAD_SECONDS ?? 30);
const CONNECTIONS = Number(process.env.LOAD_CONNECTIONS ?? 100);

try {
  const { local, url } = await startBenchPg('ringfence_load');
  const server = await startServerProcess(url);
  const planner = DEMO_ACCOUNTS.find((a) => a.role === 'planner')!;
  const login = await signIn(server.url, planner.email, DEMO_PASSWORD);
  if (login.status !== 200) throw new Error(`sign-in failed: ${login.status} ${login.body}`);
  const headers = { cookie: login.cookie };
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
    const before = await dbCounters();
    const r = await loadRun([server.url], t.path, { connections: CONNECTIONS, seconds: SECONDS, headers });
    const after = await dbCounters();
    const perRequest = (k: 'x' | 'w') => ((after[k] - before[k]) / Math.max(1, r.requests)).toFixed(2);
    const what = `${t.name}, ${CONNECTIONS} connections × ${SECONDS} s`;
    report({
      what: `${what}, p99`, figure: r.at(99), unit: 'ms', target: P99_TARGET_MS, better: 'lower', digits: 1,
      note: `p50 ${r.at(50).toFixed(1)} ms, p95 ${r.at(95).toFixed(1)} ms, ${r.perSecond.toFixed(0)} requests/s; ` +
        `database per request: ${perRequest('x')} statements, ${perRequest('w')} row writes`,
    });
    report({ what: `${what}, errors`, figure: r.errors, unit: '', target: 0, better: 'lower', digits: 0 });
  }
  await stats.end();
  await server.close();
} finally {
  stopAll();
}
