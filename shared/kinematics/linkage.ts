import { normalizeDeg360, toDegrees, toRadians } from '../geometry/angles';
import { DEFAULT_CHORD_TOLERANCE_MM } from '../geometry/tolerance';
import type { LinkageParams } from '../schemas/armModel';
import {
  LIMIT_EPS,
  axisKinematicDeg,
  axisKinematicRangeDeg,
  axisKinematicRangeRad,
  checkJoints,
  downToolFrame,
  effectiveForearm,
  planeFrame,
  revoluteAxes,
} from './articulated';
import { profileFromPolygons, splitInterval, twoLinkRegion, type TwoLinkSpec } from './profile';
import type { AxisInfo, ForwardResult, ReachProfile } from './types';

/**
 * The linkage family (palletizers, light desktop arms): the forearm is driven through a four-bar
 * from a motor at the shoulder, and a level-keeping parallelogram holds the flange horizontal.
 *
 * Geometric model (all in the arm's vertical plane at bearing θ1, angles from horizontal, up +):
 * - J2 motor turns the upper arm directly: φu = kinematic J2. Shoulder S = (shoulderOffset,
 *   shoulderHeight); elbow E = S + upperArm·(cos φu, sin φu).
 * - J3 motor sits at the shoulder, fixed to the turret and coaxial with J2; it turns the CRANK
 *   (link a, pivot O2 on the J2 axis) to the absolute angle m3 = kinematic J3.
 * - GROUND link (d) = the upper arm itself, from O2 (J2 axis) to O4 (J3 axis at the elbow); so
 *   fourBar.ground equals upperArm and fourBar.groundAngle (the ground line's angle from the upper
 *   arm) is 0 — the schema holds both.
 * - COUPLER (b) joins the crank tip to the ROCKER (c), which turns about the elbow and is rigid with
 *   the forearm. Norton's input angle is the crank measured from the ground line:
 *   θ2 = m3 − φu − groundAngle; the solver (law of cosines, chosen branch) gives θ4 from the ground
 *   line; the forearm's angle relative to the upper arm is θrel = θ4 + groundAngle + rockerToForearm
 *   (rockerToForearm: fixed angle from the rocker lever to the forearm axis, default 0).
 * - fourBar null = an exact parallelogram: the forearm keeps the crank's absolute angle, θrel = m3 − φu.
 * - So the forearm angle depends on BOTH motors. A pose that cannot assemble is
 *   {ok:false, reason:'not-assemblable'}, never NaN.
 * - Coupled limit: the interior angle at the elbow between upper arm and forearm,
 *   interior = (180° + θrel) mod 360° (180° at full stretch, 0° folded back onto the upper arm,
 *   90° with the upper arm vertical and the forearm horizontal forward), must lie in interiorAngle.
 * - Wrist W = E + a3e·(cos(φu + θrel + φe), sin(…)) (elbow offset folded in as for articulated);
 *   the flange stays level at the constant offset F = W + (flangeOffset.horizontal, flangeOffset.vertical);
 *   the tool hangs toolLength straight below the flange.
 * The reach profile is that of the flange point F (reported as `wrist` by forward()).
 */

const SAMPLES = 2048;

/** Relative forearm angle θrel (rad) from the crank angle relative to the upper arm s = m3 − φu (rad); null when the four-bar cannot assemble. */
export function linkageRelAngle(params: Readonly<LinkageParams>, s: number, clamp = false): number | null {
  const fb = params.fourBar;
  if (!fb) return s;
  const g = toRadians(fb.groundAngle ?? 0);
  const k = toRadians(fb.rockerToForearm ?? 0);
  const a = fb.crank;
  const b = fb.coupler;
  const c = fb.rocker;
  const d = fb.ground;
  const t2 = s - g;
  const sx = a * Math.sin(t2);
  const cx = d - a * Math.cos(t2);
  const f2 = sx * sx + cx * cx;
  const f = Math.sqrt(f2);
  if (f === 0) return null;
  let cosPsi = (c * c + f2 - b * b) / (2 * c * f);
  if (cosPsi > 1 || cosPsi < -1) {
    if (!clamp && (cosPsi > 1 + 1e-12 || cosPsi < -1 - 1e-12)) return null;
    cosPsi = Math.min(1, Math.max(-1, cosPsi));
  }
  const psi = Math.acos(cosPsi);
  const beta = Math.atan2(sx, cx);
  const t4 = (fb.branch ?? 'open') === 'open' ? Math.PI - beta - psi : Math.PI - beta + psi;
  return t4 + g + k;
}

/** Interior angle at the elbow between upper arm and forearm, degrees in [0, 360): (180° + θrel) mod 360°. */
export function linkageInteriorDeg(relRad: number): number {
  return normalizeDeg360(180 + toDegrees(relRad));
}

function interiorOk(params: Readonly<LinkageParams>, relRad: number): boolean {
  const ia = linkageInteriorDeg(relRad);
  const { min, max } = params.interiorAngle;
  return ia >= min - LIMIT_EPS && ia <= max + LIMIT_EPS;
}

/** Forward kinematics of the linkage family from controller degrees (J1, J2 motor, J3 motor): flange (as `wrist`) and tool point in the arm frame, mm. */
export function linkageForward(params: Readonly<LinkageParams>, joints: readonly number[]): ForwardResult {
  const fail = checkJoints(joints, params.axes, ['°', '°', '°']);
  if (fail) return fail;
  const t1 = toRadians(axisKinematicDeg(params.axes[0], joints[0]));
  const u = toRadians(axisKinematicDeg(params.axes[1], joints[1]));
  const m3 = toRadians(axisKinematicDeg(params.axes[2], joints[2]));
  const rel = linkageRelAngle(params, m3 - u);
  if (rel === null) {
    return { ok: false, reason: 'not-assemblable', axis: 3, message: `The four-bar does not assemble at J2 = ${joints[1]}°, J3 = ${joints[2]}°` };
  }
  if (!interiorOk(params, rel)) {
    const ia = linkageInteriorDeg(rel);
    return {
      ok: false,
      reason: 'out-of-limits',
      axis: 3,
      message: `The upper arm–forearm angle ${ia.toFixed(2)}° is outside its limits ${params.interiorAngle.min}…${params.interiorAngle.max}°`,
    };
  }
  const fa = effectiveForearm(params.forearm, params.elbowOffset ?? 0);
  const sr = params.shoulderOffset;
  const sz = params.shoulderHeight;
  const er = sr + params.upperArm * Math.cos(u);
  const ez = sz + params.upperArm * Math.sin(u);
  const wr = er + fa.length * Math.cos(u + rel + fa.phase);
  const wz = ez + fa.length * Math.sin(u + rel + fa.phase);
  const fr = wr + (params.flangeOffset?.horizontal ?? 0);
  const fz = wz + (params.flangeOffset?.vertical ?? 0);
  const tool = params.toolLength ?? 0;
  const at = (r: number, z: number) => ({ x: r * Math.cos(t1), y: r * Math.sin(t1), z });
  return {
    ok: true,
    wrist: at(fr, fz),
    tool: at(fr, fz - tool),
    frames: [
      { label: 'base', origin: { x: 0, y: 0, z: 0 }, rotation: planeFrame('', t1, 0, 0, 0).rotation },
      planeFrame('shoulder', t1, sr, sz, u),
      planeFrame('elbow', t1, er, ez, u + rel),
      planeFrame('wrist', t1, wr, wz, 0),
      planeFrame('flange', t1, fr, fz, 0),
      downToolFrame(t1, fr, fz - tool),
    ],
  };
}

/** Range of s = m3 − φu (rad) reachable from the motor ranges. */
function sRangeOf(params: Readonly<LinkageParams>): [number, number] {
  const [u0, u1] = axisKinematicRangeRad(params.axes[1]);
  const [m0, m1] = axisKinematicRangeRad(params.axes[2]);
  return [m0 - u1, m1 - u0];
}

function bisect(pred: (s: number) => boolean, a: number, b: number): number {
  const pa = pred(a);
  for (let i = 0; i < 60; i++) {
    const m = (a + b) / 2;
    if (pred(m) === pa) a = m;
    else b = m;
  }
  return (a + b) / 2;
}

/**
 * Break points of s (rad) where the linkage's joint-space structure changes: assembly limits,
 * interior-angle limits, full stretch / fold of the effective forearm (sin(θrel + φe) = 0) and the
 * rocker's dead points (θrel extremal), found by dense sampling and bisection.
 */
export function linkageBreaks(params: Readonly<LinkageParams>): number[] {
  const [s0, s1] = sRangeOf(params);
  const phase = effectiveForearm(params.forearm, params.elbowOffset ?? 0).phase;
  const breaks: number[] = [];
  const n = SAMPLES;
  const ss = new Float64Array(n + 1);
  const rel = new Array<number | null>(n + 1);
  for (let i = 0; i <= n; i++) {
    ss[i] = s0 + ((s1 - s0) * i) / n;
    rel[i] = linkageRelAngle(params, ss[i]);
  }
  const assembles = (s: number) => linkageRelAngle(params, s) !== null;
  const feasible = (s: number) => {
    const r = linkageRelAngle(params, s);
    return r !== null && interiorOk(params, r);
  };
  const sinPos = (s: number) => Math.sin(linkageRelAngle(params, s, true)! + phase) > 0;
  for (let i = 1; i <= n; i++) {
    const a = ss[i - 1];
    const b = ss[i];
    const ra = rel[i - 1];
    const rb = rel[i];
    if ((ra === null) !== (rb === null)) breaks.push(bisect(assembles, a, b));
    if (feasible(a) !== feasible(b)) breaks.push(bisect(feasible, a, b));
    if (ra !== null && rb !== null && sinPos(a) !== sinPos(b)) breaks.push(bisect(sinPos, a, b));
  }
  // Dead points: the unwrapped θrel turns back.
  for (let i = 1; i < n; i++) {
    const r0 = rel[i - 1];
    const r1 = rel[i];
    const r2 = rel[i + 1];
    if (r0 === null || r1 === null || r2 === null) continue;
    const d1 = Math.atan2(Math.sin(r1 - r0), Math.cos(r1 - r0));
    const d2 = Math.atan2(Math.sin(r2 - r1), Math.cos(r2 - r1));
    if (d1 * d2 < 0) {
      // Golden-section search of the extremum on [s_{i−1}, s_{i+1}].
      const sign = d1 > 0 ? 1 : -1;
      const f = (s: number) => {
        const r = linkageRelAngle(params, s, true)!;
        return sign * Math.atan2(Math.sin(r - r1), Math.cos(r - r1));
      };
      let a = ss[i - 1];
      let b = ss[i + 1];
      const g = (Math.sqrt(5) - 1) / 2;
      for (let k = 0; k < 80; k++) {
        const c = b - g * (b - a);
        const d = a + g * (b - a);
        if (f(c) > f(d)) b = d;
        else a = c;
      }
      breaks.push((a + b) / 2);
    }
  }
  return breaks.sort((x, y) => x - y);
}

/** Whether the linkage has any pose in its motor ranges: 'ok', 'not-assemblable', or 'interior-angle' (assembles but never within interiorAngle). */
export function linkageFeasibility(params: Readonly<LinkageParams>): 'ok' | 'not-assemblable' | 'interior-angle' {
  const [s0, s1] = sRangeOf(params);
  const intervals = splitInterval(s0, s1, linkageBreaks(params));
  let assembles = false;
  for (const [a, b] of intervals) {
    const mid = (a + b) / 2;
    const r = linkageRelAngle(params, mid);
    if (r === null) continue;
    assembles = true;
    if (interiorOk(params, r)) return 'ok';
  }
  return assembles ? 'interior-angle' : 'not-assemblable';
}

/** The two-link description of a linkage in motor space: u = φu, s = m3 − φu, band u + s = m3 within the J3 range. */
export function linkageTwoLinkSpec(params: Readonly<LinkageParams>): TwoLinkSpec {
  const fa = effectiveForearm(params.forearm, params.elbowOffset ?? 0);
  return {
    origin: [params.shoulderOffset, params.shoulderHeight],
    l1: params.upperArm,
    l2: fa.length,
    phase: fa.phase,
    offset: [params.flangeOffset?.horizontal ?? 0, params.flangeOffset?.vertical ?? 0],
    uRange: axisKinematicRangeRad(params.axes[1]),
    sRange: sRangeOf(params),
    sumRange: axisKinematicRangeRad(params.axes[2]),
    rel: (s) => linkageRelAngle(params, s, true)!,
    feasible: (s) => {
      const r = linkageRelAngle(params, s);
      return r !== null && interiorOk(params, r);
    },
    breaks: linkageBreaks(params),
  };
}

/** Side reach profile of the flange over the motor ranges with the four-bar and the interior-angle limit, (r, z) in mm (exact boundary tracing in motor space). */
export function linkageReachProfile(params: Readonly<LinkageParams>, opts: { toleranceMm?: number } = {}): ReachProfile {
  const tol = opts.toleranceMm ?? DEFAULT_CHORD_TOLERANCE_MM;
  return profileFromPolygons(twoLinkRegion(linkageTwoLinkSpec(params), tol), tol + 0.02);
}

/** Bearing range of the reach plane, kinematic degrees (from the J1 limits). */
export function linkageJ1Range(params: Readonly<LinkageParams>): { min: number; max: number } {
  return axisKinematicRangeDeg(params.axes[0]);
}

/** Axes in controller degrees (J1, J2 motor, J3 motor). */
export function linkageAxes(params: Readonly<LinkageParams>): AxisInfo[] {
  return revoluteAxes(params.axes, ['J1', 'J2', 'J3']);
}
