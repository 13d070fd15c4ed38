import { Matrix4, Vector3 } from 'three';
import { describe, expect, it } from 'vitest';
import { articulatedForward } from '@shared/kinematics/articulated';
import { parseArmParams } from '@shared/kinematics/families';
import { scaraForward, scaraRadialRange } from '@shared/kinematics/scara';
import type { ArticulatedParams, ScaraParams } from '@shared/schemas/armModel';

const ax = (min: number, max: number) => ({ min, max, zeroOffset: 0, direction: 1 as const });
const free = [ax(-180, 180), ax(-180, 180)];

function tool(f: ReturnType<typeof scaraForward>) {
  if (!f.ok) throw new Error(f.message);
  return f;
}

describe('forward kinematics against textbook closed forms', () => {
  it('planar 2R, l1 = l2 = 1 (1000 mm), θ = (30°, 45°) → (1.12484, 1.46593)', () => {
    // Source: Spong, Hutchinson & Vidyasagar, planar elbow arm; Siciliano et al. §2.9 (docs/sources.md, values [derived]).
    const p = parseArmParams({ family: 'scara', innerLink: 1000, outerLink: 1000, strokeMin: 0, strokeMax: 100, axes: free }) as ScaraParams;
    const f = tool(scaraForward(p, [30, 45, 0]));
    expect(f.wrist.x).toBeCloseTo(1124.84, 2);
    expect(f.wrist.y).toBeCloseTo(1465.93, 2);
  });

  it('planar 2R, l = (0.5, 0.4) m, θ = (0°, 90°) → (0.5, 0.4)', () => {
    // Source: same closed form (docs/sources.md [derived]).
    const p = parseArmParams({ family: 'scara', innerLink: 500, outerLink: 400, strokeMin: 0, strokeMax: 100, axes: free }) as ScaraParams;
    const f = tool(scaraForward(p, [0, 90, 50]));
    expect(f.wrist.x).toBeCloseTo(500, 9);
    expect(f.wrist.y).toBeCloseTo(400, 9);
    expect(f.wrist.z).toBe(50);
  });

  it('planar 2R reach annulus |l1 − l2| … l1 + l2 with unlimited θ2', () => {
    // Source: Spong et al. / Siciliano et al. §2.9 (docs/sources.md [pub]).
    const p = parseArmParams({ family: 'scara', innerLink: 500, outerLink: 400, strokeMin: 0, strokeMax: 100, axes: free }) as ScaraParams;
    const [lo, hi] = scaraRadialRange(p);
    expect(lo).toBeCloseTo(100, 9);
    expect(hi).toBeCloseTo(900, 9);
  });

  it('anthropomorphic 3R with base height: d1 = 300, a2 = 500, a3 = 400, θ = (45°, 30°, −60°) → (551.1, 551.1, 350.0) mm', () => {
    // Source: Siciliano et al. §2.9.3 anthropomorphic arm with d1 added to z (docs/sources.md, value [derived]).
    const p = parseArmParams({ family: 'articulated', shoulderHeight: 300, shoulderOffset: 0, upperArm: 500, forearm: 400, axes: [ax(-180, 180), ax(-180, 180), ax(-180, 180)] }) as ArticulatedParams;
    const f = articulatedForward(p, [45, 30, -60]);
    if (!f.ok) throw new Error(f.message);
    expect(f.wrist.x).toBeCloseTo(551.1, 1);
    expect(f.wrist.y).toBeCloseTo(551.1, 1);
    expect(f.wrist.z).toBeCloseTo(350.0, 6);
  });

  it('articulated frames agree with an independent three.js Matrix4 composition to 1e-9', () => {
    // Source: three.js Matrix4 (general-purpose matrix library) as an independent FK implementation.
    const p = parseArmParams({
      family: 'articulated',
      shoulderHeight: 450,
      shoulderOffset: 150,
      upperArm: 610,
      forearm: 660,
      elbowOffset: 115,
      toolLength: 120,
      axes: [{ min: -170, max: 170, zeroOffset: 10, direction: -1 }, ax(-60, 150), { min: -200, max: 70, zeroOffset: -5, direction: 1 }],
    }) as ArticulatedParams;
    const deg = Math.PI / 180;
    for (const q of [
      [0, 0, 0],
      [35, 20, -70],
      [-120, 140, -190],
      [160, -55, 60],
    ]) {
      const f = articulatedForward(p, q);
      if (!f.ok) throw new Error(f.message);
      const t1 = (-q[0] + 10) * deg;
      const t2 = q[1] * deg;
      const t3 = (q[2] - 5) * deg;
      // Base → J1 turn → shoulder → pitch up by θ2 (a rotation of −θ2 about local y) → upper arm → pitch θ3.
      const m = new Matrix4().makeRotationZ(t1);
      m.multiply(new Matrix4().makeTranslation(150, 0, 450));
      m.multiply(new Matrix4().makeRotationY(-t2));
      const shoulder = new Vector3().setFromMatrixPosition(m);
      m.multiply(new Matrix4().makeTranslation(610, 0, 0));
      m.multiply(new Matrix4().makeRotationY(-t3));
      const elbow = new Vector3().setFromMatrixPosition(m);
      const elbowRot = m.elements; // column-major
      // Forearm along local x, elbow offset along local z (perpendicular, upward at zero pitch).
      m.multiply(new Matrix4().makeTranslation(660, 0, 115));
      const wrist = new Vector3().setFromMatrixPosition(m);
      const frames = Object.fromEntries(f.frames.map((fr) => [fr.label, fr]));
      for (const [a, b] of [
        [frames.shoulder.origin, shoulder],
        [frames.elbow.origin, elbow],
        [f.wrist, wrist],
      ] as const) {
        expect(a.x).toBeCloseTo(b.x, 9);
        expect(a.y).toBeCloseTo(b.y, 9);
        expect(a.z).toBeCloseTo(b.z, 9);
      }
      expect(f.tool.z).toBeCloseTo(wrist.z - 120, 9);
      const R = frames.elbow.rotation;
      for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) expect(R[r][c]).toBeCloseTo(elbowRot[c * 4 + r], 9);
    }
  });
});
