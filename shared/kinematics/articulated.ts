import { toRadians } from '../geometry/angles';
import { DEFAULT_CHORD_TOLERANCE_MM } from '../geometry/tolerance';
import type { ArticulatedParams, AxisParams } from '../schemas/armModel';
import { profileFromPolygons, twoLinkRegion } from './profile';
import type { AxisInfo, ForwardResult, Frame, ReachProfile, Vec3 } from './types';

/**
 * The articulated family: J1 vertical; J2 and J3 horizontal and parallel; the wrist is a point
 * (a six-axis arm's wrist centre). In the arm's vertical plane at bearing θ1 (kinematic J1):
 *   shoulder S = (shoulderOffset, shoulderHeight),
 *   elbow    E = S + upperArm·(cos θ2, sin θ2)            (θ2: upper arm from horizontal, up +),
 *   wrist    W = E + a3e·(cos(θ2 + θ3 + φe), sin(…))      (θ3: forearm relative to the upper arm),
 * where the elbow offset e (perpendicular to the forearm at J3, positive to the forearm's left,
 * i.e. upward when the forearm points outward horizontally) is folded into the effective forearm
 * a3e = √(forearm² + e²) and angle φe = atan2(e, forearm). The plan point is r·(cos θ1, sin θ1).
 * The reach profile is that of the wrist centre; the tool hangs toolLength straight below it.
 */

/** Allowance on axis limits for values typed or computed exactly at a limit (deg or mm). */
export const LIMIT_EPS = 1e-9;

/** Controller angle → kinematic angle of one axis: direction·angle + zeroOffset, degrees. */
export function axisKinematicDeg(axis: Readonly<AxisParams>, controllerDeg: number): number {
  return (axis.direction ?? 1) * controllerDeg + (axis.zeroOffset ?? 0);
}

/** Kinematic range [min, max] of one axis from its controller limits, degrees (sorted for direction −1). */
export function axisKinematicRangeDeg(axis: Readonly<AxisParams>): { min: number; max: number } {
  const a = axisKinematicDeg(axis, axis.min);
  const b = axisKinematicDeg(axis, axis.max);
  return { min: Math.min(a, b), max: Math.max(a, b) };
}

/** Kinematic range of one axis in radians, as a sorted pair. */
export function axisKinematicRangeRad(axis: Readonly<AxisParams>): [number, number] {
  const r = axisKinematicRangeDeg(axis);
  return [toRadians(r.min), toRadians(r.max)];
}

/** Axes of a revolute-only model in controller degrees, labelled J1…Jn (or with the given labels). */
export function revoluteAxes(axes: ReadonlyArray<AxisParams>, labels?: readonly string[]): AxisInfo[] {
  return axes.map((a, i) => ({ label: labels?.[i] ?? `J${i + 1}`, kind: 'revolute', min: a.min, max: a.max }));
}

/**
 * Checks joint values against the axes (controller units): a failure value for a wrong count or a
 * value outside its limits; throws when a value is not a finite number.
 */
export function checkJoints(joints: readonly number[], limits: ReadonlyArray<{ min: number; max: number }>, units: readonly string[]): Extract<ForwardResult, { ok: false }> | null {
  if (joints.length !== limits.length) {
    return { ok: false, reason: 'bad-joint-count', message: `Expected ${limits.length} joint values, got ${joints.length}` };
  }
  for (let i = 0; i < joints.length; i++) {
    const v = joints[i];
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new Error(`joints[${i}] must be a finite number`);
    const { min, max } = limits[i];
    if (v < min - LIMIT_EPS || v > max + LIMIT_EPS) {
      const u = units[i] ?? '°';
      return { ok: false, reason: 'out-of-limits', axis: i + 1, message: `J${i + 1} = ${v}${u} is outside its limits ${min}…${max}${u}` };
    }
  }
  return null;
}

/** A frame in the arm's vertical plane at bearing b (rad): origin at (r, z), x axis pitched up by p (rad). */
export function planeFrame(label: string, bearing: number, r: number, z: number, pitch: number): Frame {
  const cb = Math.cos(bearing);
  const sb = Math.sin(bearing);
  const cp = Math.cos(pitch);
  const sp = Math.sin(pitch);
  return {
    label,
    origin: { x: r * cb, y: r * sb, z },
    rotation: [
      [cp * cb, -sb, -sp * cb],
      [cp * sb, cb, -sp * sb],
      [sp, 0, cp],
    ],
  };
}

/** Tool frame: origin at (r, z) in the plane at bearing b (rad), z axis pointing straight down. */
export function downToolFrame(bearing: number, r: number, z: number): Frame {
  const cb = Math.cos(bearing);
  const sb = Math.sin(bearing);
  return {
    label: 'tool',
    origin: { x: r * cb, y: r * sb, z },
    rotation: [
      [cb, sb, 0],
      [sb, -cb, 0],
      [0, 0, -1],
    ],
  };
}

/** Effective forearm length and angle with the elbow offset folded in: √(a3² + e²), atan2(e, a3). */
export function effectiveForearm(forearm: number, elbowOffset: number): { length: number; phase: number } {
  return { length: Math.hypot(forearm, elbowOffset), phase: Math.atan2(elbowOffset, forearm) };
}

const vec = (bearing: number, r: number, z: number): Vec3 => ({ x: r * Math.cos(bearing), y: r * Math.sin(bearing), z });

/** Forward kinematics of the articulated family from controller degrees (J1, J2, J3): wrist centre and tool point in the arm frame, mm (planar chain trigonometry). */
export function articulatedForward(params: Readonly<ArticulatedParams>, joints: readonly number[]): ForwardResult {
  const fail = checkJoints(joints, params.axes, ['°', '°', '°']);
  if (fail) return fail;
  const t1 = toRadians(axisKinematicDeg(params.axes[0], joints[0]));
  const t2 = toRadians(axisKinematicDeg(params.axes[1], joints[1]));
  const t3 = toRadians(axisKinematicDeg(params.axes[2], joints[2]));
  const fa = effectiveForearm(params.forearm, params.elbowOffset ?? 0);
  const sr = params.shoulderOffset;
  const sz = params.shoulderHeight;
  const er = sr + params.upperArm * Math.cos(t2);
  const ez = sz + params.upperArm * Math.sin(t2);
  const wr = er + fa.length * Math.cos(t2 + t3 + fa.phase);
  const wz = ez + fa.length * Math.sin(t2 + t3 + fa.phase);
  const tool = params.toolLength ?? 0;
  const frames: Frame[] = [
    { label: 'base', origin: { x: 0, y: 0, z: 0 }, rotation: planeFrame('', t1, 0, 0, 0).rotation },
    planeFrame('shoulder', t1, sr, sz, t2),
    planeFrame('elbow', t1, er, ez, t2 + t3),
    planeFrame('wrist', t1, wr, wz, t2 + t3),
    downToolFrame(t1, wr, wz - tool),
  ];
  return { ok: true, wrist: vec(t1, wr, wz), tool: vec(t1, wr, wz - tool), frames };
}

/** Side reach profile of the wrist centre over the J2 × J3 limits, (r, z) in mm (exact boundary tracing). */
export function articulatedReachProfile(params: Readonly<ArticulatedParams>, opts: { toleranceMm?: number } = {}): ReachProfile {
  const tol = opts.toleranceMm ?? DEFAULT_CHORD_TOLERANCE_MM;
  const fa = effectiveForearm(params.forearm, params.elbowOffset ?? 0);
  const polygons = twoLinkRegion(
    {
      origin: [params.shoulderOffset, params.shoulderHeight],
      l1: params.upperArm,
      l2: fa.length,
      phase: fa.phase,
      uRange: axisKinematicRangeRad(params.axes[1]),
      sRange: axisKinematicRangeRad(params.axes[2]),
    },
    tol,
  );
  return profileFromPolygons(polygons, tol + 0.02);
}

/** Bearing range of the reach plane, kinematic degrees (from the J1 limits). */
export function articulatedJ1Range(params: Readonly<ArticulatedParams>): { min: number; max: number } {
  return axisKinematicRangeDeg(params.axes[0]);
}

/** Axes in controller degrees (J1, J2, J3). */
export function articulatedAxes(params: Readonly<ArticulatedParams>): AxisInfo[] {
  return revoluteAxes(params.axes);
}
