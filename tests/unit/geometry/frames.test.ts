import fc from 'fast-check';
import { Matrix4, Vector3 } from 'three';
import { describe, expect, it } from 'vitest';
import { toRadians } from '@shared/geometry/angles';
import { armPose } from '@shared/geometry/frames';
import { armPoint, planPoint, type ArmPoint, type PlanPoint, type Polygon2 } from '@shared/geometry/types';

const coord = fc.double({ min: -50000, max: 50000, noNaN: true });
const yaw = fc.double({ min: -720, max: 720, noNaN: true });
const placement = fc.record({ x: coord, y: coord, yaw, mountHeight: fc.double({ min: -2000, max: 5000, noNaN: true }) });

/**
 * Independent implementation: the placement as a three.js Matrix4 (a general-purpose 3D library),
 * translation (x, y, mount height) times rotation about z by the yaw — the homogeneous transform of
 * the arm base frame in the plan frame.
 */
function threeBase(p: { x: number; y: number; yaw: number; mountHeight: number }): Matrix4 {
  return new Matrix4().makeTranslation(p.x, p.y, p.mountHeight).multiply(new Matrix4().makeRotationZ((p.yaw * Math.PI) / 180));
}

function deepFreeze<T>(o: T): T {
  if (o && typeof o === 'object') {
    Object.freeze(o);
    for (const v of Object.values(o)) deepFreeze(v);
  }
  return o;
}

describe('armPose: plan frame ↔ arm frame', () => {
  it('agrees with a three.js Matrix4 base transform both ways (arm → plan, and plan → arm through the inverse)', () => {
    fc.assert(
      fc.property(placement, coord, coord, coord, (pl, u, v, w) => {
        const pose = armPose(pl);
        const m = threeBase(pl);
        const onPlan = new Vector3(u, v, w).applyMatrix4(m);
        const [px, py] = pose.toPlan(armPoint(u, v));
        expect(px).toBeCloseTo(onPlan.x, 6);
        expect(py).toBeCloseTo(onPlan.y, 6);
        // The pose's z rule (arm z = plan z − mount height) against the matrix's z row.
        expect(w).toBeCloseTo(pose.toArmZ(onPlan.z), 6);
        const back = new Vector3(u, v, w).applyMatrix4(m.clone().invert());
        const [ax, ay] = pose.toArm(planPoint(u, v));
        expect(ax).toBeCloseTo(back.x, 6);
        expect(ay).toBeCloseTo(back.y, 6);
        expect(pose.toArmZ(w)).toBeCloseTo(back.z, 6);
      }),
      { numRuns: 500 },
    );
  });

  it('round trips: toArm(toPlan(p)) and toPlan(toArm(p)) return the point (to rounding)', () => {
    fc.assert(
      fc.property(placement, coord, coord, (pl, a, b) => {
        const pose = armPose(pl);
        const [u, v] = pose.toArm(pose.toPlan(armPoint(a, b)));
        expect(u).toBeCloseTo(a, 6);
        expect(v).toBeCloseTo(b, 6);
        const [x, y] = pose.toPlan(pose.toArm(planPoint(a, b)));
        expect(x).toBeCloseTo(a, 6);
        expect(y).toBeCloseTo(b, 6);
      }),
      { numRuns: 500 },
    );
  });

  it('worked values: a quarter turn takes arm +x to plan north, a half turn to plan west', () => {
    // Plain trigonometry: R(90°)·(1000, 0) = (0, 1000); R(180°)·(1000, 0) = (−1000, 0).
    const quarter = armPose({ x: 100, y: 200, yaw: 90, mountHeight: 400 });
    const [x1, y1] = quarter.toPlan(armPoint(1000, 0));
    expect(x1).toBeCloseTo(100, 9);
    expect(y1).toBeCloseTo(1200, 9);
    expect(quarter.toArmZ(1000)).toBe(600);
    const [x2, y2] = armPose({ x: 0, y: 0, yaw: 180 }).toPlan(armPoint(1000, 0));
    expect(x2).toBeCloseTo(-1000, 9);
    expect(y2).toBeCloseTo(0, 9);
    expect(quarter.cos).toBeCloseTo(0, 12);
    expect(quarter.sin).toBe(1);
  });

  it('placePolygons moves every vertex as toPlan does, bit for bit, and leaves its input untouched', () => {
    const pose = armPose({ x: 12000, y: -3500, yaw: 37, mountHeight: 0 });
    const polys: Polygon2[] = deepFreeze([[[[0, 0], [1500, 0], [1500, 800], [0, 800]], [[100, 100], [100, 200], [200, 200]]]]);
    const placed = pose.placePolygons(polys);
    expect(placed.length).toBe(1);
    placed[0].forEach((ring, i) =>
      ring.forEach((p, k) => {
        const q = pose.toPlan(armPoint(polys[0][i][k][0], polys[0][i][k][1]));
        expect(p[0]).toBe(q[0]);
        expect(p[1]).toBe(q[1]);
      }),
    );
  });

  it('the pose keeps the placement in named units', () => {
    const pose = armPose({ x: 1, y: 2, yaw: 30, mountHeight: 450 });
    expect([pose.xMm, pose.yMm, pose.yawDeg, pose.mountHeightMm]).toEqual([1, 2, 30, 450]);
    // Without a mount height the arm stands on the floor.
    expect(armPose({ x: 0, y: 0, yaw: 0 }).mountHeightMm).toBe(0);
  });

  it('frames and units do not mix (checked by npm run typecheck: each line below must fail to compile)', () => {
    const pose = armPose({ x: 0, y: 0, yaw: 90 });
    const p: PlanPoint = planPoint(1, 2);
    const a: ArmPoint = armPoint(1, 2);
    // @ts-expect-error an arm-frame point where a plan-frame point is wanted
    pose.toArm(a);
    // @ts-expect-error a plan-frame point where an arm-frame point is wanted
    pose.toPlan(p);
    // @ts-expect-error an arm-frame point is not a plan-frame point
    const wrongPlan: PlanPoint = a;
    // @ts-expect-error a plan-frame point is not an arm-frame point
    const wrongArm: ArmPoint = p;
    // @ts-expect-error radians where degrees are wanted
    toRadians(toRadians(30));
    // @ts-expect-error an angle in degrees where a length in mm is wanted
    planPoint(pose.yawDeg, 0);
    // At run time they are plain pairs of numbers.
    expect([wrongPlan, wrongArm]).toEqual([[1, 2], [1, 2]]);
  });
});
