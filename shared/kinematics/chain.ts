/**
 * The chain family: a general serial arm from a DH table (standard or modified/Craig).
 *
 * Parameters (lengths mm, angles deg):
 * - `convention`: 'standard' (A_i = Rz(θ)Tz(d)Tx(a)Rx(α)) or 'modified' (A_i = Rx(α_{i-1})Tx(a_{i-1})Rz(θ)Tz(d));
 *   in a modified table row i's `a`, `alpha` are a_{i-1}, α_{i-1} (the link before joint i).
 * - `joints[i]`: `type`, `a`, `alpha`, `d`, `theta`, limits `min`/`max` in controller units,
 *   optional `zeroOffset` (default 0) and `direction` (+1 / −1, default +1).
 *   Revolute: kinematic θ_i = theta + direction·value + zeroOffset (deg); limits are controller degrees.
 *   Prismatic: kinematic d_i = d + direction·value + zeroOffset (mm); limits are controller mm; θ fixed.
 * - `tool`: the tool point in the last frame, mm (a translation; the tool frame keeps the last rotation).
 * - `toolLength`: tooling that reaches beyond the tool point (e.g. a held part), mm; it does not
 *   move the tool point and only grows maximum space. `payloadRadius`, stopping data: as other families.
 * - Joint 1 must be revolute about the base z axis through the origin (plan bands need a vertical
 *   J1): always so in standard DH; in modified DH row 1 must have alpha ≡ 0 (mod 360) and a = 0.
 *
 * Frames returned by forward(): 'base' (identity), 'J1' … 'Jn' (frame i = T_0^i, the frame after
 * joint i's link transform), 'tool'. `wrist` is the origin of frame 4 (the wrist centre of a
 * spherical wrist, where J4, J5, J6 axes meet in both conventions) for chains of 6 or more joints,
 * otherwise the origin of the last joint frame (before the tool offset).
 * Failures carry `axis` numbered from 1 (1 = J1).
 *
 * The parameter schema lives in schemas/armModel.ts (chainParamsSchema).
 *
 * Reach profile: sampled (sampledProfile.ts) for the tool point with J1 at kinematic 0;
 * r = sign(x)·√(x²+y²), and the lateral offset is the mean y of those samples (see lateralOffset).
 */
import { chainJointSchema, chainParamsSchema, type ChainJoint, type ChainParams } from '../schemas/armModel';
import { DhPointEvaluator, chainTransforms, dhRowsAt, mat4Translation, type DhJoint, type Mat4 } from './dh';
import { HaltonSequence, sampleProfile, type AxisRange, type SampledReachProfile } from './sampledProfile';
import type { AxisInfo, FamilyModule, ForwardResult, Frame, Vec3 } from './types';

export { chainJointSchema, chainParamsSchema, type ChainJoint, type ChainParams };

const DEG = Math.PI / 180;
/** Allowance on axis limits for values typed or computed at the limit (deg or mm). */
const LIMIT_EPS = 1e-9;

/** Constant DH part of each joint, radians and mm (the joint variable is added to θ or d). */
export function chainDhJoints(params: ChainParams): DhJoint[] {
  return params.joints.map((j) => ({ kind: j.type, a: j.a, alpha: j.alpha * DEG, d: j.d, theta: j.theta * DEG }));
}

/** Controller value of joint i (deg / mm) → its kinematic variable (rad added to θ, or mm added to d): direction·value + zeroOffset. */
export function chainJointVariable(joint: ChainJoint, value: number): number {
  const v = (joint.direction ?? 1) * value + (joint.zeroOffset ?? 0);
  return joint.type === 'revolute' ? v * DEG : v;
}

function toVec3(m: Mat4): Vec3 {
  return { x: m[3], y: m[7], z: m[11] };
}

function toFrame(label: string, m: Mat4): Frame {
  return {
    label,
    origin: toVec3(m),
    rotation: [
      [m[0], m[1], m[2]],
      [m[4], m[5], m[6]],
      [m[8], m[9], m[10]],
    ],
  };
}

/** Forward kinematics of a DH chain (product of homogeneous transforms) from controller values, every frame in the arm frame, mm. */
export function chainForward(params: ChainParams, joints: readonly number[]): ForwardResult {
  const n = params.joints.length;
  if (joints.length !== n) {
    return { ok: false, reason: 'bad-joint-count', message: `Expected ${n} joint values, got ${joints.length}` };
  }
  joints.forEach((v, i) => {
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new Error(`joints[${i}] must be a finite number`);
  });
  for (let i = 0; i < n; i++) {
    const j = params.joints[i];
    if (joints[i] < j.min - LIMIT_EPS || joints[i] > j.max + LIMIT_EPS) {
      const unit = j.type === 'revolute' ? '°' : ' mm';
      return {
        ok: false,
        reason: 'out-of-limits',
        axis: i + 1,
        message: `J${i + 1} = ${joints[i]}${unit} is outside its limits ${j.min}…${j.max}${unit}`,
      };
    }
  }
  const q = params.joints.map((j, i) => chainJointVariable(j, joints[i]));
  const mats = chainTransforms(params.convention, dhRowsAt(chainDhJoints(params), q), mat4Translation(params.tool.x, params.tool.y, params.tool.z));
  const frames = mats.map((m, i) => toFrame(i === 0 ? 'base' : i <= n ? `J${i}` : 'tool', m));
  const wristIndex = n >= 6 ? 4 : n;
  return { ok: true, tool: toVec3(mats[n + 1]), wrist: toVec3(mats[wristIndex]), frames };
}

/**
 * Joints (counted from the last) that cannot move the tool point: a trailing revolute joint whose
 * axis passes through the point (e.g. J6 with the tool on its axis; J4–J6 with the tool at the wrist
 * centre). Sampling holds them fixed, which shrinks the sampled dimension without changing the region.
 */
export function chainIdleTrailingJoints(params: ChainParams, epsMm = 1e-9): number {
  const joints = chainDhJoints(params);
  let x = params.tool.x, y = params.tool.y, zz = params.tool.z;
  let idle = 0;
  for (let i = joints.length - 1; i >= 1; i--) {
    const j = joints[i];
    if (j.kind !== 'revolute') break;
    // the point in the frame whose z axis is joint i's axis, independent of θ_i when it lies on that axis
    if (params.convention === 'standard') {
      const ca = Math.cos(j.alpha), sa = Math.sin(j.alpha);
      const px = x + j.a, py = ca * y - sa * zz;
      if (Math.hypot(px, py) > epsMm) break;
      // on the axis: the point is (0, 0, z') in frame i-1 for every θ_i
      zz = sa * y + ca * zz + j.d;
      x = 0;
      y = 0;
    } else {
      if (Math.hypot(x, y) > epsMm) break;
      const z1 = zz + j.d;
      x = j.a;
      y = -Math.sin(j.alpha) * z1;
      zz = Math.cos(j.alpha) * z1;
    }
    idle++;
  }
  return idle;
}

/** Sampling ranges in controller units: J1 held at kinematic 0, idle trailing joints held at mid-range, the rest over their limits. */
function chainSamplingRanges(params: ChainParams): AxisRange[] {
  const n = params.joints.length;
  const idle = chainIdleTrailingJoints(params);
  return params.joints.map((j, i): AxisRange => {
    if (i === 0) {
      // J1 at kinematic 0 (θ offset included), in or out of its limits: r and z do not depend on J1
      const c = -((j.zeroOffset ?? 0) + j.theta) / (j.direction ?? 1);
      return { min: c, max: c };
    }
    if (i >= n - idle) {
      const mid = (j.min + j.max) / 2;
      return { min: mid, max: mid };
    }
    return { min: j.min, max: j.max };
  });
}

/**
 * Sampled side reach profile of a chain's tool point (Halton sampling + raster + d3-contour),
 * arm-frame (r, z), mm. The joints that sampling holds fixed cost no trigonometry per pose: idle
 * trailing joints are folded into the tool point (the product of DH transforms split after the last
 * moving joint), and J1 at kinematic 0 is applied as one constant transform.
 */
export function chainSampledProfile(params: ChainParams, opts: { toleranceMm?: number; maxSamples?: number } = {}): SampledReachProfile {
  const ranges = chainSamplingRanges(params);
  const dh = chainDhJoints(params);
  const jointsP = params.joints;
  const n = jointsP.length;
  const moving = n - chainIdleTrailingJoints(params);
  let tool = params.tool;
  if (moving < n) {
    const tail = new DhPointEvaluator(params.convention, dh.slice(moving), params.tool);
    const qt = Float64Array.from(jointsP.slice(moving), (j, i) => chainJointVariable(j, ranges[moving + i].min));
    const t = new Float64Array(3);
    tail.point(qt, t);
    tool = { x: t[0], y: t[1], z: t[2] };
  }
  // J1 (held fixed by the sampling ranges): θ and d constant, so its transform is constant.
  const j1 = dh[0];
  const q1 = chainJointVariable(jointsP[0], ranges[0].min);
  const th1 = j1.kind === 'prismatic' ? j1.theta : j1.theta + q1;
  const d1 = j1.kind === 'prismatic' ? j1.d + q1 : j1.d;
  const ct = Math.cos(th1), st = Math.sin(th1), ca = Math.cos(j1.alpha), sa = Math.sin(j1.alpha), a1 = j1.a;
  const standard = params.convention === 'standard';
  const inner = new DhPointEvaluator(params.convention, dh.slice(1, moving), tool);
  const scale = Float64Array.from(jointsP, (j) => (j.direction ?? 1) * (j.type === 'revolute' ? DEG : 1));
  const bias = Float64Array.from(jointsP, (j) => (j.zeroOffset ?? 0) * (j.type === 'revolute' ? DEG : 1));
  const qk = new Float64Array(Math.max(0, moving - 1));
  const pointFn = (q: Float64Array, out: Float64Array): boolean => {
    for (let i = 1; i < moving; i++) qk[i - 1] = scale[i] * q[i] + bias[i];
    inner.point(qk, out);
    const x = out[0], y = out[1], z = out[2];
    if (standard) {
      // Rx(α), then Tz(d)·Tx(a), then Rz(θ) (as DhPointEvaluator)
      const y1 = ca * y - sa * z;
      const x2 = x + a1;
      out[0] = ct * x2 - st * y1;
      out[1] = st * x2 + ct * y1;
      out[2] = sa * y + ca * z + d1;
    } else {
      // Tz(d), then Rz(θ), then Tx(a), then Rx(α)
      const z1 = z + d1;
      const y2 = st * x + ct * y;
      out[0] = ct * x - st * y + a1;
      out[1] = ca * y2 - sa * z1;
      out[2] = sa * y2 + ca * z1;
    }
    return true;
  };
  return sampleProfile(pointFn, ranges, opts);
}

/** Mean side offset y of the tool point from the plane through J1 at kinematic 0, mm (mean over 1024 Halton poses). */
export function chainLateralOffset(params: ChainParams): number {
  const evaluator = new DhPointEvaluator(params.convention, chainDhJoints(params), params.tool);
  const ranges = chainSamplingRanges(params);
  const free = ranges.map((r, i) => (r.max > r.min ? i : -1)).filter((i) => i >= 0);
  const halton = free.length > 0 ? new HaltonSequence(free.length) : null;
  const u = new Float64Array(Math.max(1, free.length));
  const q = new Float64Array(ranges.length);
  const p = new Float64Array(3);
  const count = halton ? 1024 : 1;
  let sum = 0;
  for (let s = 0; s < count; s++) {
    halton?.next(u);
    for (let i = 0; i < ranges.length; i++) q[i] = ranges[i].min;
    free.forEach((i, f) => {
      q[i] = ranges[i].min + u[f] * (ranges[i].max - ranges[i].min);
    });
    for (let i = 0; i < ranges.length; i++) q[i] = chainJointVariable(params.joints[i], q[i]);
    evaluator.point(q, p);
    sum += p[1];
  }
  const mean = sum / count;
  return Math.abs(mean) < 1e-9 ? 0 : mean;
}

/** J1 range as the reach plane's bearing in the arm frame, kinematic degrees (direction·limit + zeroOffset + θ). */
export function chainJ1Range(params: ChainParams): { min: number; max: number } {
  const j = params.joints[0];
  const a = (j.direction ?? 1) * j.min + (j.zeroOffset ?? 0) + j.theta;
  const b = (j.direction ?? 1) * j.max + (j.zeroOffset ?? 0) + j.theta;
  return { min: Math.min(a, b), max: Math.max(a, b) };
}

/** Axes in controller units for forms and the pose panel. */
export function chainAxes(params: ChainParams): AxisInfo[] {
  return params.joints.map((j, i) => ({ label: `J${i + 1}`, kind: j.type, min: j.min, max: j.max }));
}

export const chainFamily: FamilyModule<ChainParams> = {
  family: 'chain',
  schema: chainParamsSchema,
  forward: chainForward,
  reachProfile: (params, opts) => chainSampledProfile(params, opts),
  j1Range: chainJ1Range,
  lateralOffset: chainLateralOffset,
  axes: chainAxes,
};
