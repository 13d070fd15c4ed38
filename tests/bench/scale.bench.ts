// Scale-out benchmark: ONE throwaway PostgreSQL and TWO server processes on it (different ports, the
// same DATABASE_URL), as several servers behind a load balancer would run. Checks that nothing lives
// in one server: (a) a session made on server 1 works on server 2, and signing out on server 2 ends
// it on server 1; (b) the same cell layout saved from both servers with the same version: one save
// wins, the other gets 409, and both servers then read the winning edit whole (nothing half-written,
// nothing lost); (c) failed sign-ins alternated over both servers are refused (429) at the same
// attempt as on one server (the counters are in PostgreSQL). Then (d) the load benchmark's runs
// (autocannon, as load.bench.ts) on one server and spread over both: requests/s for each and the
// ratio, what a second server buys on this machine. On a machine of few cores the load generator,
// both servers and PostgreSQL share them, so the ratio can be about 1×; it is printed as measured.
// Targets of (d) as load.bench.ts: p99 ≤ 100 ms, 0 errors.
// Run: npm run bench scale   (SCALE_SECONDS / SCALE_CONNECTIONS override the duration and connections)
import { canonicalJson } from '@shared/canonicalJson';
import type { LayoutDto } from '@shared/schemas/layout';
import { loadConfig } from '../../backend/src/config';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../backend/src/db/seed';
import { check, info, report } from './report';
import { loadRun, signIn, startBenchPg, startServerProcess, stopAll, type BenchServer } from './servers';

const P99_TARGET_MS = 100;
const SECONDS = Number(process.env.SCALE_SECONDS ?? 15);
const CONNECTIONS = Number(process.env.SCALE_CONNECTIONS ?? 100);
const EDIT_ROUNDS = 5;

async function getJson<T>(url: string, cookie: string): Promise<{ status: number; body: T }> {
  const r = await fetch(url, { headers: { cookie } });
  return { status: r.status, body: (await r.json()) as T };
}

async function putLayout(server: BenchServer, cookie: string, id: number, body: unknown): Promise<{ status: number; body: { layout?: LayoutDto; currentVersion?: number; error?: { code: string } } }> {
  const r = await fetch(`${server.url}/api/layouts/${id}`, { method: 'PUT', headers: { 'content-type': 'application/json', cookie }, body: JSON.stringify(body) });
  return { status: r.status, body: (await r.json()) as { layout?: LayoutDto; currentVersion?: number } };
}

/** Failed sign-ins for one e-mail, taking the servers in turn, until the first 429: its attempt number. */
async function attemptsUntilRefused(servers: BenchServer[], email: string, most: number): Promise<number> {
  for (let i = 1; i <= most; i++) {
    const r = await signIn(servers[i % servers.length].url, email, 'not the password of anyone');
    if (r.status === 429) return i;
    if (r.status !== 401) throw new Error(`failed sign-in ${i} answered ${r.status}: ${r.body}`);
  }
  return NaN;
}

try {
  const { url: databaseUrl } = await startBenchPg('ringfence_scale');
  // The first server migrates and seeds the empty database; the second starts on what it made.
  const one = await startServerProcess(databaseUrl);
  const two = await startServerProcess(databaseUrl);
  console.log(`two servers, ${one.url} and ${two.url}, on one PostgreSQL database`);
  const planner = DEMO_ACCOUNTS.find((a) => a.role === 'planner')!;

  // (a) The session lives in PostgreSQL: made on one server, honoured and ended on the other.
  {
    const login = await signIn(one.url, planner.email, DEMO_PASSWORD);
    if (login.status !== 200) throw new Error(`sign-in on server 1 failed: ${login.status} ${login.body}`);
    const me = await getJson<{ user?: { email: string } }>(`${two.url}/api/auth/me`, login.cookie);
    const list = await fetch(`${two.url}/api/projects`, { headers: { cookie: login.cookie } });
    await list.arrayBuffer();
    const anonymous = await fetch(`${two.url}/api/projects`);
    await anonymous.arrayBuffer();
    check(
      'a session made on server 1 is honoured by server 2',
      me.status === 200 && me.body.user?.email === planner.email && list.status === 200 && anonymous.status === 401,
      `server 2 with server 1's cookie: /api/auth/me ${me.status} (${me.body.user?.email ?? 'no user'}), /api/projects ${list.status}; without it ${anonymous.status}`,
    );
    const out = await fetch(`${two.url}/api/auth/logout`, { method: 'POST', headers: { cookie: login.cookie } });
    const after = await fetch(`${one.url}/api/projects`, { headers: { cookie: login.cookie } });
    await after.arrayBuffer();
    check('signing out on server 2 ends the session on server 1', out.status === 204 && after.status === 401, `sign-out ${out.status}, then server 1 answers ${after.status}`);
  }

  const login = await signIn(two.url, planner.email, DEMO_PASSWORD);
  if (login.status !== 200) throw new Error(`sign-in on server 2 failed: ${login.status} ${login.body}`);
  const cookie = login.cookie;
  const projects = await getJson<{ projects: Array<{ id: number }> }>(`${one.url}/api/projects`, cookie);
  const layouts = await getJson<{ layouts: Array<{ id: number }> }>(`${one.url}/api/projects/${projects.body.projects[0].id}/layouts`, cookie);
  const layoutId = layouts.body.layouts[0].id;

  // (b) Both servers save the same layout from the same version, at the same moment.
  {
    const problems: string[] = [];
    const winners: string[] = [];
    const first = (await getJson<{ layout: LayoutDto }>(`${one.url}/api/layouts/${layoutId}`, cookie)).body.layout;
    if (first.content.arms.length < 2) throw new Error('the demo layout needs two arms for the edit check');
    let version = first.version;
    let lastWin: LayoutDto | null = null;
    for (let round = 1; round <= EDIT_ROUNDS; round++) {
      const base = (await getJson<{ layout: LayoutDto }>(`${two.url}/api/layouts/${layoutId}`, cookie)).body.layout;
      // Server 1 moves the first arm east, server 2 the second arm north, both from `base`.
      const edits = [
        { server: one, name: 'server 1', content: { ...base.content, arms: base.content.arms.map((a, i) => (i === 0 ? { ...a, x: a.x + 100 } : a)) } },
        { server: two, name: 'server 2', content: { ...base.content, arms: base.content.arms.map((a, i) => (i === 1 ? { ...a, y: a.y + 100 } : a)) } },
      ];
      const answers = await Promise.all(edits.map((e) => putLayout(e.server, cookie, layoutId, { version: base.version, content: e.content })));
      const won = answers.findIndex((a) => a.status === 200);
      const lost = answers.findIndex((a) => a.status === 409);
      if (won === -1 || lost === -1) {
        problems.push(`round ${round}: answers ${answers.map((a) => a.status).join(' and ')}, not one 200 and one 409`);
        continue;
      }
      winners.push(edits[won].name);
      const saved = answers[won].body.layout!;
      if (saved.version !== base.version + 1) problems.push(`round ${round}: saved as version ${saved.version}, not ${base.version + 1}`);
      if (answers[lost].body.currentVersion !== saved.version) problems.push(`round ${round}: the 409 names version ${answers[lost].body.currentVersion}, not ${saved.version}`);
      if (canonicalJson(saved.content) !== canonicalJson(edits[won].content)) problems.push(`round ${round}: the saved content is not the winning edit as sent`);
      // Read back from both servers: the winning edit whole, the refused one nowhere.
      for (const s of [one, two]) {
        const back = (await getJson<{ layout: LayoutDto }>(`${s.url}/api/layouts/${layoutId}`, cookie)).body.layout;
        if (back.version !== saved.version || canonicalJson(back.content) !== canonicalJson(saved.content)) {
          problems.push(`round ${round}: ${s === one ? 'server 1' : 'server 2'} reads version ${back.version} with other content than the winning save`);
        }
      }
      version = saved.version;
      lastWin = saved;
    }
    check(
      `the same layout saved from both servers with the same version, ${EDIT_ROUNDS} rounds: one 200 and one 409 each, the winner read back whole`,
      problems.length === 0 && lastWin !== null && version === first.version + EDIT_ROUNDS,
      problems.length ? problems.join('; ') : `versions ${first.version} → ${version}; won by ${winners.join(', ')}`,
    );
  }

  // (c) The sign-in limit counts in PostgreSQL: alternating servers does not buy more attempts.
  {
    const limit = loadConfig({ ...process.env }).loginRateLimit;
    const onOne = await attemptsUntilRefused([one], 'nobody-one@fernhill.test', 3 * limit);
    const overTwo = await attemptsUntilRefused([one, two], 'nobody-two@fernhill.test', 3 * limit);
    check(
      'failed sign-ins alternated over both servers are refused at the same attempt as on one server',
      onOne === limit + 1 && overTwo === onOne,
      `first 429 at attempt ${onOne} on server 1 alone, ${overTwo} alternating over both (limit ${limit} per account and address)`,
    );
  }

  // (d) Throughput on one server and spread over two.
  const targets = [
    { name: 'projects list', path: '/api/projects' },
    { name: 'layout read', path: `/api/layouts/${layoutId}` },
  ];
  const headers = { cookie };
  for (const t of targets) {
    await loadRun([one.url, two.url], t.path, { connections: CONNECTIONS, seconds: 3, headers }); // warm both servers up
    const single = await loadRun([one.url], t.path, { connections: CONNECTIONS, seconds: SECONDS, headers });
    const both = await loadRun([one.url, two.url], t.path, { connections: CONNECTIONS, seconds: SECONDS, headers });
    for (const [label, r] of [['one server', single], ['two servers, connections split evenly', both]] as const) {
      const what = `${t.name}, ${label}, ${CONNECTIONS} connections × ${SECONDS} s`;
      report({ what: `${what}, p99`, figure: r.at(99), unit: 'ms', target: P99_TARGET_MS, better: 'lower', digits: 1, note: `p50 ${r.at(50).toFixed(1)} ms, ${r.perSecond.toFixed(0)} requests/s` });
      report({ what: `${what}, errors`, figure: r.errors, unit: '', target: 0, better: 'lower', digits: 0 });
    }
    info(`${t.name}, requests/s two servers over one`, both.perSecond / single.perSecond, '×', `${both.perSecond.toFixed(0)} vs ${single.perSecond.toFixed(0)} requests/s`, 2);
  }

  // Let each server answer what autocannon left queued before it closes its database pools.
  await Promise.all([one, two].map((s) => fetch(`${s.url}/api/health`).then((r) => r.arrayBuffer())));
  await Promise.all([one.close(), two.close()]);
} finally {
  stopAll();
}
