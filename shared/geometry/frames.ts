/**
 * The plan frame and an arm's frame, and the one pose transform between them.
 *
 * Plan frame: x east, y north, z up from finished floor level, mm. Arm frame: origin on the J1 axis
 * at the mounting face, x along J1 zero, y 90° counter-clockwise of it, z up from the mounting face,
 * mm. An arm placed at (x, y) with yaw θ (degrees counter-clockwise from plan +x) and mount height h:
 *   plan = R(θ)·arm + (x, y),  armZ = planZ − h,
 * where R(θ) is the planar rotation matrix. The arithmetic order below is fixed on purpose (radians
 * as (deg·π)/180, x·cos − y·sin + x0, …): analysis results, plan sheets and exports are compared
 * byte for byte, so every caller must round exactly the same way.
 */
import type { ArmPoint, Degrees, Millimetres, PlanPoint, Polygon2, Pt, Radians } from './types';

/** Where an arm stands, as stored in a layout (plan mm; yaw degrees CCW from +x; mount height mm, default 0). */
export interface PosePlacement {
  /** Plan position of the J1 axis, mm (field names as in the layout JSON). */
  x: Millimetres;
  y: Millimetres;
  /** Degrees counter-clockwise from plan +x. */
  yaw: Degrees;
  /** Mounting face above finished floor level, mm; 0 when absent. */
  mountHeight?: Millimetres;
}

/** A placed arm's pose: the plan ↔ arm transform (see the file comment for the frames). */
export interface ArmPose {
  /** Base position on the plan, mm. */
  readonly xMm: Millimetres;
  readonly yMm: Millimetres;
  /** Yaw of J1 zero, degrees counter-clockwise from plan +x. */
  readonly yawDeg: Degrees;
  /** Height of the mounting face above finished floor level, mm. */
  readonly mountHeightMm: Millimetres;
  /** cos and sin of the yaw: the plan direction [cos, sin] of the arm's +x axis. */
  readonly cos: number;
  readonly sin: number;
  /** A plan point in the arm frame, mm. */
  toArm(p: Readonly<PlanPoint>): ArmPoint;
  /** An arm-frame point on the plan, mm. */
  toPlan(p: Readonly<ArmPoint>): PlanPoint;
  /** toArm without allocating, for hot loops: the arm-frame x and y of the plan point (px, py), mm. */
  armX(px: Millimetres, py: Millimetres): Millimetres;
  armY(px: Millimetres, py: Millimetres): Millimetres;
  /** A plan height (above floor) as an arm-frame height (above the mounting face), mm. */
  toArmZ(zPlanMm: Millimetres): Millimetres;
  /** Arm-frame polygons on the plan (new arrays; the input is untouched), mm. */
  placePolygons(polys: ReadonlyArray<Polygon2>): Polygon2[];
}

/** Degrees → radians in the order the pose uses, (deg·π)/180 (see the file comment). */
function yawRadians(yawDeg: Degrees): Radians {
  return (yawDeg * Math.PI) / 180;
}

/** The pose of an arm placed at (x, y) mm with yaw (deg CCW) and mount height (mm): rotation about the J1 axis, then translation. */
export function armPose(placement: Readonly<PosePlacement>): ArmPose {
  const x0: Millimetres = placement.x;
  const y0: Millimetres = placement.y;
  const mountHeightMm: Millimetres = placement.mountHeight ?? 0;
  const yawRad = yawRadians(placement.yaw);
  const c = Math.cos(yawRad);
  const s = Math.sin(yawRad);
  const place = ([u, v]: Readonly<Pt>): Pt => [c * u - s * v + x0, s * u + c * v + y0];
  return {
    xMm: x0,
    yMm: y0,
    yawDeg: placement.yaw,
    mountHeightMm,
    cos: c,
    sin: s,
    toArm([px, py]) {
      const dx = px - x0;
      const dy = py - y0;
      return [c * dx + s * dy, -s * dx + c * dy] as ArmPoint;
    },
    armX: (px, py) => c * (px - x0) + s * (py - y0),
    armY: (px, py) => -s * (px - x0) + c * (py - y0),
    toPlan: (p) => place(p) as PlanPoint,
    toArmZ: (zPlanMm) => zPlanMm - mountHeightMm,
    placePolygons: (polys) => polys.map((poly) => poly.map((ring) => ring.map(place))),
  };
}
