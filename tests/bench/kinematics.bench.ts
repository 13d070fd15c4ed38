// Kinematics core benchmark: reach profile and whole-arm envelope time per family (target ≤ 50 ms
// each; a sampled six-axis chain's profile ≤ 20 ms), the point-reach region build per arm (≤ 50 ms)
// and point-reach throughput (≥ 10 million checks per second on one core). Reports figures and
// ratios (report.ts).
// The machine may be shared: the throughput figure is CPU time of this process (process.cpuUsage,
// which a busy neighbour does not inflate the way it does wall time), its wall figure in the note;
// the build figure is wall time (CPU time in the note: it also counts the compiler's and the
// collector's own threads).
// "region build" is a cold build (buildMarginFn: nothing of the region cached; the reach profile,
// timed on its own line above, from its cache): for a chain the outline simplified outward by half
// a raster cell, for a scara its plan region, and the distance grid over it.
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildEnvelopeProfile } from '@shared/kinematics/envelope';
import { familyOf, reachProfileOf } from '@shared/kinematics/families';
import { buildMarginFn, makePointReach, marginFnOf } from '@shared/kinematics/pointReach';
import { scaraPlanRegion } from '@shared/kinematics/scara';
import { ArmModelInput, type ArmParams, type ScaraParams } from '@shared/schemas/armModel';
import { report } from './report';

const PROFILE_TARGET_MS = 50;
const CHAIN_PROFILE_TARGET_MS = 20;
const REGION_TARGET_MS = 50;
const REACH_TARGET_PER_S = 10e6;

/** CPU time of this process, ms. */
function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

const dir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../samples/arm-models');
const models: Array<{ name: string; params: ArmParams }> = readdirSync(dir)
  .filter((f) => f.endsWith('.json'))
  .sort()
  .map((f) => ArmModelInput.parse(JSON.parse(readFileSync(path.join(dir, f), 'utf8'))));

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

console.log('reach profile (uncached, median of 15 after 3 warm-up runs)');
for (const m of models) {
  const fam = familyOf(m.params);
  for (let i = 0; i < 3; i++) fam.reachProfile(m.params);
  const times: number[] = [];
  let profile = fam.reachProfile(m.params);
  for (let i = 0; i < 15; i++) {
    const t = performance.now();
    profile = fam.reachProfile(m.params);
    times.push(performance.now() - t);
  }
  const ms = median(times);
  const verts = profile.polygons.reduce((n, p) => n + p.reduce((k, r) => k + r.length, 0), 0);
  report({
    what: `reach profile, ${m.params.family}, ${m.name}`, figure: ms, unit: 'ms', target: m.params.family === 'chain' ? CHAIN_PROFILE_TARGET_MS : PROFILE_TARGET_MS, better: 'lower', digits: 2,
    note: `${profile.method}, ${verts} vertices, ±${profile.toleranceMm.toFixed(2)} mm`,
  });
}

// A scara's side profile is a rectangle; its real work is the plan region over J1 × J2.
for (const m of models.filter((x) => x.params.family === 'scara')) {
  const params = m.params as ScaraParams;
  for (let i = 0; i < 3; i++) scaraPlanRegion(params);
  const times: number[] = [];
  for (let i = 0; i < 15; i++) {
    const t = performance.now();
    scaraPlanRegion(params);
    times.push(performance.now() - t);
  }
  const ms = median(times);
  report({ what: `scara plan region, ${m.name}`, figure: ms, unit: 'ms', target: PROFILE_TARGET_MS, better: 'lower', digits: 2, note: 'exact, 2R plan region' });
}

// The whole-arm envelope (links, tool, payload as capsules): built afresh each run from the cached
// tool-point profile (its own time is the line above).
console.log('\nwhole-arm envelope (uncached, tool-point profile cached; median of 9 after 2 warm-up runs)');
for (const m of models) {
  reachProfileOf(m.params);
  for (let i = 0; i < 2; i++) buildEnvelopeProfile(m.params);
  const times: number[] = [];
  let env = buildEnvelopeProfile(m.params);
  for (let i = 0; i < 9; i++) {
    const t = performance.now();
    env = buildEnvelopeProfile(m.params);
    times.push(performance.now() - t);
  }
  const ms = median(times);
  const verts = env.polygons.reduce((n, p) => n + p.reduce((k, r) => k + r.length, 0), 0);
  report({
    what: `whole-arm envelope, ${m.params.family}, ${m.name}`, figure: ms, unit: 'ms', target: PROFILE_TARGET_MS, better: 'lower', digits: 2,
    note: `${env.method}, ${verts} vertices, ±${env.toleranceMm.toFixed(2)} mm`,
  });
}

console.log('\npoint-reach region build (cold: buildMarginFn, region and grid anew; median of 7 after the first call, wall time)');
for (const m of models) {
  reachProfileOf(m.params);
  const w0 = performance.now();
  const c0 = cpuMs();
  buildMarginFn(m.params, null);
  const firstCpu = cpuMs() - c0;
  const firstWall = performance.now() - w0;
  const cpu: number[] = [];
  const wall: number[] = [];
  for (let i = 0; i < 7; i++) {
    const w = performance.now();
    const c = cpuMs();
    buildMarginFn(m.params, null);
    cpu.push(cpuMs() - c);
    wall.push(performance.now() - w);
  }
  report({
    what: `point-reach region build, ${m.params.family}, ${m.name}`, figure: median(wall), unit: 'ms', target: REGION_TARGET_MS, better: 'lower', digits: 1,
    note: `CPU median ${median(cpu).toFixed(1)} ms; first call ${firstCpu.toFixed(1)} ms CPU, ${firstWall.toFixed(1)} ms wall`,
  });
}

console.log('\npoint reach (arm-frame points in a box of ±1.2 × max reach, z over the profile heights ± 300 mm; CPU time)');
const N = 5_000_000;
for (const m of models) {
  const margin = marginFnOf(m.params, null);
  const profile = familyOf(m.params).reachProfile(m.params);
  const R = 1.2 * profile.maxReach;
  const pts = new Float64Array(3 * 65536);
  let seed = 12345;
  const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 4294967296);
  for (let i = 0; i < 65536; i++) {
    pts[3 * i] = (rnd() * 2 - 1) * R;
    pts[3 * i + 1] = (rnd() * 2 - 1) * R;
    pts[3 * i + 2] = profile.zMin - 300 + rnd() * (profile.zMax - profile.zMin + 600);
  }
  let reached = 0;
  for (let i = 0; i < 200_000; i++) margin(pts[3 * (i & 65535)], pts[3 * (i & 65535) + 1], pts[3 * (i & 65535) + 2]);
  const t = performance.now();
  const c = cpuMs();
  for (let i = 0; i < N; i++) {
    const k = 3 * (i & 65535);
    if (margin(pts[k], pts[k + 1], pts[k + 2]) >= 0) reached++;
  }
  const rate = N / ((cpuMs() - c) / 1000);
  const wallRate = N / ((performance.now() - t) / 1000);
  report({
    what: `point reach, ${m.params.family}, ${m.name}`, figure: rate / 1e6, unit: 'M checks/s', target: REACH_TARGET_PER_S / 1e6, better: 'higher', digits: 2,
    note: `${((100 * reached) / N).toFixed(1)} % reached, ${(wallRate / 1e6).toFixed(2)} M checks/s by wall time`,
  });
}

// The object form used by callers that want {reached, marginMm}.
const first = models[0];
const check = makePointReach(first.params);
const t = performance.now();
let hits = 0;
for (let i = 0; i < 1_000_000; i++) if (check({ x: (i % 1000) - 500, y: ((i * 7) % 1000) - 500, z: 500 }).reached) hits++;
console.log(`\n  makePointReach object form (${first.params.family}): ${(1 / ((performance.now() - t) / 1000)).toFixed(2)} M checks/s (${hits} reached)`);
