// Chain kinematics benchmark: FK throughput (full frames and the sampling fast path) against the
// same chain composed with three.js Matrix4, and the sampled-profile time (target ≤ 20 ms, 6-axis, default tolerance).
import { Matrix4 } from 'three';
import { chainDhJoints, chainFamily, chainJointVariable, type ChainParams } from '@shared/kinematics/chain';
import { DhPointEvaluator } from '@shared/kinematics/dh';
import { demoSixAxis, randomPose, seeded, sixAxisExample } from '../unit/kinematics/chainFixtures';
import { report } from './report';

const DEG = Math.PI / 180;
const PROFILE_TARGET_MS = 20;

function threeTool(p: ChainParams, q: number[], m: Matrix4[], acc: Matrix4): number {
  acc.identity();
  p.joints.forEach((j, i) => {
    const v = (j.direction ?? 1) * q[i] + (j.zeroOffset ?? 0);
    const theta = (j.theta + (j.type === 'revolute' ? v : 0)) * DEG;
    const d = j.d + (j.type === 'prismatic' ? v : 0);
    acc.multiply(m[0].makeRotationZ(theta)).multiply(m[1].makeTranslation(0, 0, d)).multiply(m[2].makeTranslation(j.a, 0, 0)).multiply(m[3].makeRotationX(j.alpha * DEG));
  });
  acc.multiply(m[4].makeTranslation(p.tool.x, p.tool.y, p.tool.z));
  return acc.elements[12];
}

function rate(fn: () => number, poses: number): { perSecond: number; sink: number } {
  let sink = 0;
  for (let w = 0; w < 2; w++) sink += fn(); // warm up
  const t = performance.now();
  sink += fn();
  return { perSecond: (poses / (performance.now() - t)) * 1000, sink };
}

const demo = demoSixAxis();
const POSES = 200_000;
const rand = seeded(42);
const poses = Array.from({ length: POSES }, () => randomPose(demo, rand));

const full = rate(() => {
  let s = 0;
  for (const q of poses) {
    const r = chainFamily.forward(demo, q);
    if (r.ok) s += r.tool.x;
  }
  return s;
}, POSES);

const evaluator = new DhPointEvaluator(demo.convention, chainDhJoints(demo), demo.tool);
const qk = poses.map((q) => Float64Array.from(q, (v, i) => chainJointVariable(demo.joints[i], v)));
const out = new Float64Array(3);
const fast = rate(() => {
  let s = 0;
  for (const q of qk) {
    evaluator.point(q, out);
    s += out[0];
  }
  return s;
}, POSES);

const mats = Array.from({ length: 5 }, () => new Matrix4());
const acc = new Matrix4();
const three = rate(() => {
  let s = 0;
  for (const q of poses) s += threeTool(demo, q, mats, acc);
  return s;
}, POSES);

const fmt = (v: number) => `${(v / 1e6).toFixed(2)} M poses/s`;
console.log('Demo Six-Axis 2000, forward kinematics');
console.log(`  forward() with every frame      ${fmt(full.perSecond)}`);
console.log(`  tool-point fast path            ${fmt(fast.perSecond)}`);
console.log(`  three.js Matrix4 (tool only)    ${fmt(three.perSecond)}`);
console.log(`  ratio fast path / three.js      ${(fast.perSecond / three.perSecond).toFixed(1)}×`);
console.log(`  ratio forward() / three.js      ${(full.perSecond / three.perSecond).toFixed(2)}×`);

for (const [name, params, tol] of [
  ['Demo Six-Axis 2000, default tolerance', demo, undefined],
  ['Demo Six-Axis 2000, 15 mm', demo, 15],
  ['the six-axis DH worked example, 8 mm', sixAxisExample, 8],
] as Array<[string, ChainParams, number | undefined]>) {
  const times: number[] = [];
  const opts = tol ? { toleranceMm: tol } : undefined;
  const t0 = performance.now();
  let profile = chainFamily.reachProfile(params, opts);
  const first = performance.now() - t0;
  // warm: the profile is recomputed while a planner edits a model (worker / server stay hot)
  for (let i = 0; i < 12; i++) chainFamily.reachProfile(params, opts);
  for (let i = 0; i < 9; i++) {
    const t = performance.now();
    profile = chainFamily.reachProfile(params, opts);
    times.push(performance.now() - t);
  }
  times.sort((a, b) => a - b);
  const median = times[4];
  const extra = profile as typeof profile & { samples?: number; converged?: boolean };
  const detail =
    `min ${times[0].toFixed(1)}, first call ${first.toFixed(0)} ms, tolerance ${profile.toleranceMm} mm, ` +
    `${extra.samples} samples, converged ${extra.converged}`;
  if (name.endsWith('default tolerance')) {
    report({ what: `sampled profile, ${name} (warm median of 9)`, figure: median, unit: 'ms', target: PROFILE_TARGET_MS, better: 'lower', digits: 1, note: detail });
  } else {
    console.log(`sampled profile, ${name}, for comparison: warm median ${median.toFixed(1)} ms (${detail}), ${(median / PROFILE_TARGET_MS).toFixed(2)} × the target`);
  }
}
if (!Number.isFinite(full.sink + fast.sink + three.sink)) process.exitCode = 1;
