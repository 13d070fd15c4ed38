import { toRadians } from '../geometry/angles';
import { DEFAULT_CHORD_TOLERANCE_MM } from '../geometry/tolerance';
import type { Polygon2 } from '../geometry/types';
import type { ScaraParams } from '../schemas/armModel';
import { axisKinematicDeg, axisKinematicRangeDeg, checkJoints, downToolFrame, planeFrame } from './articulated';
import { profileFromPolygons, twoLinkRadialRange, twoLinkRegion } from './profile';
import type { AxisInfo, ForwardResult, ReachProfile } from './types';

/**
 * The scara family: J1 and J2 turn about vertical axes (planar 2R, Spong et al.; Siciliano et al.
 * §2.9): flange (x, y) = innerLink·(cos θ1, sin θ1) + outerLink·(cos(θ1 + θ2), sin(θ1 + θ2)); J3 is
 * the vertical stroke, given directly as the flange height in the arm frame (strokeMin…strokeMax).
 * The tool points straight down from the flange by toolLength.
 *
 * The tool's bearing is θ1 plus an angle that changes with θ2, so the J1 range alone does not bound
 * it: reach in plan is the 2R region over J1 × J2 (the union over J1 of the J2 curves), which J1
 * limits do NOT cut along straight radial lines. Its "profile" in (r, z) is the radial interval ×
 * the stroke, for display and heights; coverage uses the plan region.
 */

/** Forward kinematics of the scara family from controller values (J1°, J2°, stroke mm): flange and tool point in the arm frame, mm (planar 2R). */
export function scaraForward(params: Readonly<ScaraParams>, joints: readonly number[]): ForwardResult {
  const limits = [params.axes[0], params.axes[1], { min: params.strokeMin, max: params.strokeMax }];
  const fail = checkJoints(joints, limits, ['°', '°', ' mm']);
  if (fail) return fail;
  const t1 = toRadians(axisKinematicDeg(params.axes[0], joints[0]));
  const t2 = toRadians(axisKinematicDeg(params.axes[1], joints[1]));
  const h = joints[2];
  const ex = params.innerLink * Math.cos(t1);
  const ey = params.innerLink * Math.sin(t1);
  const x = ex + params.outerLink * Math.cos(t1 + t2);
  const y = ey + params.outerLink * Math.sin(t1 + t2);
  const tool = params.toolLength ?? 0;
  const bearing = Math.atan2(y, x);
  const r = Math.hypot(x, y);
  return {
    ok: true,
    wrist: { x, y, z: h },
    tool: { x, y, z: h - tool },
    frames: [
      { label: 'base', origin: { x: 0, y: 0, z: 0 }, rotation: planeFrame('', t1, 0, 0, 0).rotation },
      { label: 'elbow', origin: { x: ex, y: ey, z: h }, rotation: planeFrame('', t1 + t2, 0, 0, 0).rotation },
      { label: 'flange', origin: { x, y, z: h }, rotation: planeFrame('', t1 + t2, 0, 0, 0).rotation },
      downToolFrame(bearing, r, h - tool),
    ],
  };
}

/**
 * Plan region of the scara flange in the arm frame over the J1 × J2 limits (optionally a narrower
 * kinematic J1 range, degrees), mm: the planar 2R region by exact boundary tracing.
 */
export function scaraPlanRegion(params: Readonly<ScaraParams>, j1KinDeg?: { min: number; max: number }, tol: number = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  const j1 = j1KinDeg ?? axisKinematicRangeDeg(params.axes[0]);
  const j2 = axisKinematicRangeDeg(params.axes[1]);
  return twoLinkRegion(
    {
      origin: [0, 0],
      l1: params.innerLink,
      l2: params.outerLink,
      uRange: [toRadians(j1.min), toRadians(j1.max)],
      sRange: [toRadians(j2.min), toRadians(j2.max)],
    },
    tol,
  );
}

/** Radial reach interval of the scara flange over the J2 limits, mm (law of cosines on the 2R triangle). */
export function scaraRadialRange(params: Readonly<ScaraParams>): [number, number] {
  const j2 = axisKinematicRangeDeg(params.axes[1]);
  return twoLinkRadialRange(params.innerLink, params.outerLink, [toRadians(j2.min), toRadians(j2.max)]);
}

/** Side profile of the scara flange: radial interval × stroke, (r, z) in mm (exact, no arcs). */
export function scaraReachProfile(params: Readonly<ScaraParams>): ReachProfile {
  const [lo, hi] = scaraRadialRange(params);
  const ring: Array<[number, number]> = [
    [lo, params.strokeMin],
    [hi, params.strokeMin],
    [hi, params.strokeMax],
    [lo, params.strokeMax],
  ];
  return profileFromPolygons([[ring]], 0);
}

/** J1 range, kinematic degrees: the inner link's bearing (the flange bearing also depends on J2). */
export function scaraJ1Range(params: Readonly<ScaraParams>): { min: number; max: number } {
  return axisKinematicRangeDeg(params.axes[0]);
}

/** Axes in controller units: J1, J2 (deg) and the stroke J3 (mm, flange height). */
export function scaraAxes(params: Readonly<ScaraParams>): AxisInfo[] {
  return [
    { label: 'J1', kind: 'revolute', min: params.axes[0].min, max: params.axes[0].max },
    { label: 'J2', kind: 'revolute', min: params.axes[1].min, max: params.axes[1].max },
    { label: 'J3', kind: 'prismatic', min: params.strokeMin, max: params.strokeMax },
  ];
}
